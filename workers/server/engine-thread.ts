/**
 * One engine thread: takes a task, runs it with sim/, posts progress at most every 250 ms and then the
 * result. A cancelled task is not asked to stop: the thread is terminated, which frees the core at once.
 */
import { parentPort } from "node:worker_threads";
import { runTask, type EngineTask } from "./tasks";

const PROGRESS_EVERY_MS = 250;
const port = parentPort;
if (!port) throw new Error("engine-thread runs only as a worker thread");

port.on("message", (task: EngineTask) => {
  let last = 0;
  try {
    const result = runTask(task, (done) => {
      const now = Date.now();
      if (now - last >= PROGRESS_EVERY_MS) {
        last = now;
        port.postMessage({ type: "progress", done });
      }
    });
    port.postMessage({ type: "result", result });
  } catch (e) {
    port.postMessage({ type: "error", message: e instanceof Error ? e.message : String(e) });
  }
});
