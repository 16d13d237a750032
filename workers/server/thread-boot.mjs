// Entry of an engine thread: TypeScript is loaded through tsx in this thread too, then the real entry runs.
import { workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

register();
await import(workerData.entry);
