"use client";
import * as Comlink from "comlink";
import { useCallback, useEffect, useRef, useState } from "react";
import type { RunSummary } from "@sim/index";
import type { EngineApi } from "@workers/engine-api";
import { runInPool, type EngineHandle, type PoolProgress, type PoolRun } from "@workers/pool";
import { poolSize, requestedPoolSize } from "@workers/ranges";
import { mark, RUN_MARKS } from "@workers/run-marks";

export type PoolState =
  | { phase: "idle" }
  | { phase: "running"; progress: PoolProgress; workers: number }
  | { phase: "done"; summary: RunSummary; durationMs: number }
  | { phase: "cancelled" }
  | { phase: "failed"; message: string };

/** The least time between two drawn progress updates of a run. */
const PROGRESS_DRAW_MS = 300;

/** localStorage key for a pool size chosen by hand (`?workers=N` in the address wins); see workers/ranges.ts. */
export const POOL_SIZE_KEY = "pourline.engineWorkers";

function chosenPoolSize(): number {
  let stored: string | null = null;
  try {
    stored = localStorage.getItem(POOL_SIZE_KEY);
  } catch {
    // Storage refused (private mode, a sandboxed frame): choose for the device.
  }
  return requestedPoolSize(new URLSearchParams(location.search).get("workers"), stored) ?? poolSize(navigator.hardwareConcurrency);
}

function createEngine(): EngineHandle {
  // The URL must be written out here for the bundler to find and build the worker.
  const worker = new Worker(new URL("../../../workers/engine.worker.ts", import.meta.url), { type: "module" });
  return { api: Comlink.wrap<EngineApi>(worker), terminate: () => worker.terminate() };
}

/** After the page's own work (hydration, first paint), so warming the pool never delays what a person sees. */
function whenIdle(fn: () => void): () => void {
  if (typeof requestIdleCallback === "function") {
    const id = requestIdleCallback(fn, { timeout: 2_000 });
    return () => cancelIdleCallback(id);
  }
  const id = setTimeout(fn, 300);
  return () => clearTimeout(id);
}

/**
 * Runs the engine over a pool of Web Workers, one per core (`poolSize`); the page stays responsive meanwhile.
 * `warmFor`: the definition the next run will use, or null. While it is set the workers are started and
 * compile it once the page is idle, so a click pays for neither; they stay up between runs and are
 * terminated when the page goes (or a run is cancelled).
 */
export function useEnginePool(warmFor: unknown | null = null) {
  const [state, setState] = useState<PoolState>({ phase: "idle" });
  const current = useRef<PoolRun | null>(null);
  const warm = useRef<{ size: number; engines: EngineHandle[] } | null>(null);

  const enginesOfSize = useCallback((size: number) => {
    if (warm.current?.size !== size) {
      warm.current?.engines.forEach((e) => e.terminate());
      warm.current = { size, engines: Array.from({ length: size }, createEngine) };
    }
    return warm.current.engines;
  }, []);

  // A cancelled run terminates its workers (ready ones too), so the next run starts new ones.
  const cancelCurrent = useCallback(() => {
    if (!current.current) return;
    current.current.cancel();
    current.current = null;
    warm.current = null;
  }, []);

  useEffect(
    () => () => {
      cancelCurrent();
      warm.current?.engines.forEach((e) => e.terminate());
      warm.current = null;
    },
    [cancelCurrent],
  );

  useEffect(() => {
    if (warmFor === null) return;
    return whenIdle(() => {
      if (current.current) return; // a run is using them
      // A definition the engine refuses is reported by the run itself; here it only stays unprepared.
      Promise.all(enginesOfSize(chosenPoolSize()).map((e) => e.api.prepare(warmFor))).then(
        () => mark(RUN_MARKS.poolReady),
        () => {},
      );
    });
  }, [warmFor, enginesOfSize]);

  const start = useCallback(
    async (input: unknown, iterations: number, seed: string) => {
      cancelCurrent();
      mark(RUN_MARKS.click);
      const workers = chosenPoolSize();
      setState({ phase: "running", workers, progress: { done: 0, total: iterations, perSecond: 0, secondsLeft: null } });
      let lastDrawn = performance.now();
      const run = runInPool({
        input,
        iterations,
        seed,
        workers,
        engines: enginesOfSize(workers),
        createEngine,
        wrapProgress: (fn) => Comlink.proxy(fn),
        transfer: Comlink.transfer,
        onProgress: (progress) => {
          // Each drawn update costs the main thread a frame (style, layout, paint), on a core the workers want;
          // a few a second read as live. The pool reports more often: every worker every 150 ms.
          const t = performance.now();
          if (t - lastDrawn < PROGRESS_DRAW_MS) return;
          lastDrawn = t;
          setState({ phase: "running", workers, progress });
        },
      });
      current.current = run;
      try {
        const result = await run.result;
        if (!result) {
          if (current.current === run || current.current === null) setState({ phase: "cancelled" });
          return null;
        }
        if (current.current !== run) return null;
        mark(RUN_MARKS.summary);
        setState({ phase: "done", summary: result.summary, durationMs: result.durationMs });
        return result;
      } catch (e) {
        setState({ phase: "failed", message: e instanceof Error ? e.message : String(e) });
        return null;
      } finally {
        if (current.current === run) current.current = null;
      }
    },
    [enginesOfSize, cancelCurrent],
  );

  const cancel = cancelCurrent;
  return { state, start, cancel };
}
