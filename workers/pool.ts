/**
 * Runs a scenario over a pool of engine workers: splits the iterations, reports progress (done, rate, time
 * left), merges the parts in index order and has one worker summarise (histograms and curves are binned there,
 * not in React). Cancel terminates the workers at once; a cancelled run resolves to null.
 */
import type { PartialRun, RunSummary } from "../sim/index";
import type { EngineApi } from "./engine-api";
import { splitIterations } from "./ranges";

export interface PoolProgress {
  done: number;
  total: number;
  perSecond: number;
  secondsLeft: number | null;
}

export interface EngineHandle {
  api: EngineApi | { [K in keyof EngineApi]: (...args: Parameters<EngineApi[K]>) => ReturnType<EngineApi[K]> };
  terminate(): void;
}

export interface PoolRun {
  result: Promise<{ summary: RunSummary; durationMs: number } | null>;
  cancel(): void;
}

export function runInPool(opts: {
  input: unknown;
  iterations: number;
  seed: string;
  workers: number;
  createEngine: () => EngineHandle;
  wrapProgress?: (fn: (done: number) => void) => (done: number) => void;
  onProgress?: (p: PoolProgress) => void;
  now?: () => number;
}): PoolRun {
  const now = opts.now ?? (() => performance.now());
  const ranges = splitIterations(opts.iterations, opts.workers);
  const engines = ranges.map(() => opts.createEngine());
  const done = new Array(ranges.length).fill(0);
  const started = now();
  let cancelled = false;
  let resolveCancel: (v: null) => void = () => {};
  const cancelledPromise = new Promise<null>((r) => (resolveCancel = r));

  const report = () => {
    const total = done.reduce((a, b) => a + b, 0);
    const elapsed = (now() - started) / 1000;
    const perSecond = elapsed > 0 ? total / elapsed : 0;
    opts.onProgress?.({ done: total, total: opts.iterations, perSecond, secondsLeft: perSecond > 0 ? (opts.iterations - total) / perSecond : null });
  };
  const wrap = opts.wrapProgress ?? ((fn) => fn);

  const work = (async () => {
    const parts: PartialRun[] = await Promise.all(
      ranges.map((r, i) =>
        engines[i].api.runRange(
          opts.input,
          opts.seed,
          r.from,
          r.to,
          wrap((d: number) => {
            done[i] = d;
            report();
          }),
        ),
      ),
    );
    if (cancelled) return null;
    const summary = await engines[0].api.summarize(opts.input, parts);
    return { summary, durationMs: Math.round(now() - started) };
  })().finally(() => engines.forEach((e) => e.terminate()));

  return {
    result: Promise.race([work.catch((e) => (cancelled ? null : Promise.reject(e))), cancelledPromise]),
    cancel() {
      cancelled = true;
      engines.forEach((e) => e.terminate());
      resolveCancel(null);
    },
  };
}
