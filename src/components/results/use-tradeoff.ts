"use client";
/**
 * The holiday trade-off computed in the browser: one Web Worker runs the plan twice on the run's own seed and
 * iteration count (at most `MAX_TRADEOFF_ITERATIONS`) — standing down over holidays and working through them.
 * Shared by the results' trade-off panel (started by a click) and the printed brief (started on opening).
 * Nothing is stored; the result lives until the page is left.
 */
import * as Comlink from "comlink";
import { useCallback, useEffect, useRef, useState } from "react";
import type { HolidayTradeoff } from "@sim/tradeoff";
import type { EngineApi } from "@workers/engine-api";

/** Two full runs in one worker: capped so the answer comes in seconds. */
export const MAX_TRADEOFF_ITERATIONS = 1000;

export type TradeoffState = { phase: "idle" } | { phase: "running" } | { phase: "done"; result: HolidayTradeoff; iterations: number } | { phase: "failed"; message: string };

export function useTradeoff(definition: unknown, seed: string, iterations: number): { state: TradeoffState; run: () => Promise<void>; n: number } {
  const [state, setState] = useState<TradeoffState>({ phase: "idle" });
  const worker = useRef<Worker | null>(null);
  useEffect(() => () => worker.current?.terminate(), []);
  const n = Math.min(iterations, MAX_TRADEOFF_ITERATIONS);

  const run = useCallback(async () => {
    worker.current?.terminate();
    // The URL must be written out here for the bundler to find and build the worker.
    const w = new Worker(new URL("../../../workers/engine.worker.ts", import.meta.url), { type: "module" });
    worker.current = w;
    setState({ phase: "running" });
    try {
      const api = Comlink.wrap<EngineApi>(w);
      const result = await api.tradeoff(definition, seed, n);
      if (worker.current === w) setState({ phase: "done", result, iterations: n });
    } catch (e) {
      if (worker.current === w) setState({ phase: "failed", message: e instanceof Error ? e.message : String(e) });
    } finally {
      w.terminate();
      if (worker.current === w) worker.current = null;
    }
  }, [definition, seed, n]);

  return { state, run, n };
}
