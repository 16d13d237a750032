"use client";
import * as Comlink from "comlink";
import { useCallback, useEffect, useRef, useState } from "react";
import type { RunSummary } from "@sim/index";
import type { EngineApi } from "@workers/engine-api";
import { runInPool, type PoolProgress, type PoolRun } from "@workers/pool";
import { poolSize } from "@workers/ranges";

export type PoolState =
  | { phase: "idle" }
  | { phase: "running"; progress: PoolProgress; workers: number }
  | { phase: "done"; summary: RunSummary; durationMs: number }
  | { phase: "cancelled" }
  | { phase: "failed"; message: string };

function createEngine() {
  // The URL must be written out here for the bundler to find and build the worker.
  const worker = new Worker(new URL("../../../workers/engine.worker.ts", import.meta.url), { type: "module" });
  return { api: Comlink.wrap<EngineApi>(worker), terminate: () => worker.terminate() };
}

/** Runs the engine over a pool of Web Workers, one per spare core; the page stays responsive meanwhile. */
export function useEnginePool() {
  const [state, setState] = useState<PoolState>({ phase: "idle" });
  const current = useRef<PoolRun | null>(null);

  useEffect(() => () => current.current?.cancel(), []);

  const start = useCallback(async (input: unknown, iterations: number, seed: string) => {
    current.current?.cancel();
    const workers = poolSize(navigator.hardwareConcurrency);
    setState({ phase: "running", workers, progress: { done: 0, total: iterations, perSecond: 0, secondsLeft: null } });
    const run = runInPool({
      input,
      iterations,
      seed,
      workers,
      createEngine,
      wrapProgress: (fn) => Comlink.proxy(fn),
      onProgress: (progress) => setState({ phase: "running", workers, progress }),
    });
    current.current = run;
    try {
      const result = await run.result;
      if (current.current !== run) return null;
      if (!result) {
        setState({ phase: "cancelled" });
        return null;
      }
      setState({ phase: "done", ...result });
      return result;
    } catch (e) {
      setState({ phase: "failed", message: e instanceof Error ? e.message : String(e) });
      return null;
    } finally {
      if (current.current === run) current.current = null;
    }
  }, []);

  const cancel = useCallback(() => current.current?.cancel(), []);
  return { state, start, cancel };
}
