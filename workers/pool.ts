/**
 * Runs a scenario over a pool of engine workers: splits the iterations, reports progress (done, rate, time
 * left), merges the parts in index order and has one worker summarise (histograms and curves are binned there,
 * not in React). Cancel terminates the workers at once; a cancelled run resolves to null.
 *
 * Workers either come ready from the caller (`engines`: started and prepared before the click, kept running
 * after the run for the next one) or are created here and terminated when the run ends. A cancelled run
 * terminates every worker it used, ready-made ones too: a worker busy in the engine cannot be stopped otherwise.
 */
import type { PartialRun, RunSummary } from "../sim/index";
import { partialBuffers, type EngineApi } from "./engine-api";
import { splitIterations } from "./ranges";
import { mark, measureEngine, RUN_MARKS } from "./run-marks";

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

export interface PoolResult {
  summary: RunSummary;
  durationMs: number;
  /** Per worker: milliseconds inside the engine, and spent compiling the scenario during the run (0 if ready). */
  engineMs: number[];
  compileMs: number[];
}

export interface PoolRun {
  result: Promise<PoolResult | null>;
  cancel(): void;
}

export function runInPool(opts: {
  input: unknown;
  iterations: number;
  seed: string;
  workers: number;
  createEngine: () => EngineHandle;
  /** Ready workers to use first (the caller's to keep or terminate, except on cancel). */
  engines?: EngineHandle[];
  wrapProgress?: (fn: (done: number) => void) => (done: number) => void;
  /** Marks values whose buffers move to the receiving thread instead of being copied (comlink's `transfer`). */
  transfer?: <T>(value: T, buffers: ArrayBuffer[]) => T;
  onProgress?: (p: PoolProgress) => void;
  now?: () => number;
}): PoolRun {
  const now = opts.now ?? (() => performance.now());
  const ranges = splitIterations(opts.iterations, opts.workers);
  const ready = (opts.engines ?? []).slice(0, ranges.length);
  const own = ranges.slice(ready.length).map(() => opts.createEngine());
  const engines = [...ready, ...own];
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
  const transfer = opts.transfer ?? ((v) => v);

  const work = (async () => {
    const results = await Promise.all(
      ranges.map(async (r, i) => {
        const asked = now();
        const res = await engines[i].api.runRange(
          opts.input,
          opts.seed,
          r.from,
          r.to,
          wrap((d: number) => {
            done[i] = d;
            report();
          }),
        );
        measureEngine(asked, { worker: i, engineMs: res.engineMs, compileMs: res.compileMs });
        return res;
      }),
    );
    if (cancelled) return null;
    mark(RUN_MARKS.rangesDone);
    const parts: PartialRun[] = results.map((r) => r.partial);
    const summary = await engines[0].api.summarize(opts.input, transfer(parts, partialBuffers(parts)));
    return { summary, durationMs: Math.round(now() - started), engineMs: results.map((r) => r.engineMs), compileMs: results.map((r) => r.compileMs) };
  })().finally(() => own.forEach((e) => e.terminate()));

  return {
    result: Promise.race([work.catch((e) => (cancelled ? null : Promise.reject(e))), cancelledPromise]),
    cancel() {
      cancelled = true;
      engines.forEach((e) => e.terminate());
      resolveCancel(null);
    },
  };
}
