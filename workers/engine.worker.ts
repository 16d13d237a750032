/// <reference lib="webworker" />
/** The engine in a Web Worker: the page stays responsive while iterations run. */
import * as Comlink from "comlink";
import { createEngineApi, partialBuffers, type EngineApi } from "./engine-api";

const api = createEngineApi();
// A range's typed arrays are handed to the page, not copied: the worker has no use for them afterwards.
const exposed: EngineApi = {
  ...api,
  async runRange(...args) {
    const r = await api.runRange(...args);
    return Comlink.transfer(r, partialBuffers([r.partial]));
  },
};
Comlink.expose(exposed);
