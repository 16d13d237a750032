/**
 * What one engine worker offers. The same object runs inside a Web Worker (through comlink) and, in tests,
 * in-process, so the pool logic is tested with the real engine.
 *
 * A worker keeps the last scenario it compiled (keyed by the definition's JSON text): `prepare` compiles
 * ahead of a run (the page warms its pool while the person reads), and `runRange` and `summarize` with the
 * same definition reuse it instead of parsing and compiling again. Iteration k depends only on the scenario,
 * the seed and k — a compiled scenario's scratch buffers are reset by each `simulate`, which is what lets one
 * range run after another on it — so a reused compile gives the same numbers as a fresh one (tested).
 */
import { compileScenario, holidayTradeoff, mergePartials, runIterations, summarizeRun, type CompiledScenario, type HolidayTradeoff, type PartialRun, type RunSummary } from "../sim/index";
import { parseScenario } from "../sim/validate";
import type { FieldProblem } from "../sim/schema";

export type ProgressFn = (done: number) => void;

/** A range of iterations as the worker returns it, with where its time went (for the page's timeline). */
export interface RangeResult {
  partial: PartialRun;
  /** Milliseconds inside the engine (`runIterations`). */
  engineMs: number;
  /** Milliseconds spent parsing and compiling the scenario for this call (0 when prepared before). */
  compileMs: number;
}

export interface EngineApi {
  /** Parses and compiles the scenario and keeps it for the calls that follow; answers the milliseconds it took. */
  prepare(input: unknown): Promise<number>;
  runRange(input: unknown, seed: string, from: number, to: number, onProgress: ProgressFn): Promise<RangeResult>;
  summarize(input: unknown, parts: PartialRun[]): Promise<RunSummary>;
  validate(input: unknown): Promise<FieldProblem[]>;
  /** The holiday trade-off: the same seed and iterations under "stand down" and "work through". */
  tradeoff(input: unknown, seed: string, iterations: number): Promise<HolidayTradeoff>;
}

const PROGRESS_EVERY_MS = 150;
/**
 * `prepare` also runs the engine on throwaway iterations, in steps, for at most WARM_UP_MS (and summarises them): the first iterations of
 * a fresh worker run before the JavaScript engine has optimised the hot loops, and two fresh workers on two cores
 * pay most, each optimising while the other computes. Measured on the development machine, December 2026: in
 * Node 20, 5,000 iterations in each of two processes at once took 1.18–1.31 s cold and 0.80–0.89 s after 100–1,000
 * throwaway ones; in `npm run bench -- --browser`, two workers' click to chart went from 1,726–2,049 ms to
 * 1,226–1,280 ms with 600 (an earlier try with 200 measured no gain in a noisy hour). Done while the person reads
 * the page; a click meanwhile waits at most WARM_UP_MS. Results do not change: each iteration resets the compiled
 * scenario's scratch (tests/unit/run-path.test.ts compares a prepared worker with a fresh one).
 */
const WARM_UP_ITERATIONS = 600;
const WARM_UP_STEP = 20;
const WARM_UP_MS = 600;

function compiledFrom(input: unknown): CompiledScenario {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(`The scenario is not valid: ${parsed.problems.map((p) => `${p.path} ${p.message}`).join("; ")}`);
  return compileScenario(parsed.scenario);
}

export function createEngineApi(now: () => number = () => Date.now()): EngineApi {
  // One cached compile per worker: a page runs one scenario at a time.
  let cached: { key: string; compiled: CompiledScenario } | null = null;
  const compiled = (input: unknown): { compiled: CompiledScenario; compileMs: number; fresh: boolean } => {
    const key = JSON.stringify(input);
    if (cached?.key === key) return { compiled: cached.compiled, compileMs: 0, fresh: false };
    const t0 = now();
    const c = compiledFrom(input);
    cached = { key, compiled: c };
    return { compiled: c, compileMs: now() - t0, fresh: true };
  };
  return {
    async prepare(input) {
      const { compiled: c, compileMs, fresh } = compiled(input);
      // Each new definition: another plan may take paths through the engine the last one did not.
      if (fresh) {
        const t0 = now();
        const parts: PartialRun[] = [];
        for (let k = 0; k < WARM_UP_ITERATIONS && now() - t0 < WARM_UP_MS; k += WARM_UP_STEP) parts.push(runIterations(c, "warm-up", k, k + WARM_UP_STEP));
        // The summary's code too: any worker may be the one that summarises the run.
        summarizeRun(c, mergePartials(parts));
      }
      return compileMs;
    },
    async runRange(input, seed, from, to, onProgress) {
      const { compiled: c, compileMs } = compiled(input);
      const t0 = now();
      let last = t0;
      const partial = runIterations(c, seed, from, to, (done: number) => {
        const t = now();
        if (t - last >= PROGRESS_EVERY_MS) {
          last = t;
          onProgress(done);
        }
      });
      const engineMs = now() - t0;
      onProgress(to - from);
      return { partial, engineMs, compileMs };
    },
    async summarize(input, parts) {
      return summarizeRun(compiled(input).compiled, mergePartials(parts));
    },
    async tradeoff(input, seed, iterations) {
      const parsed = parseScenario(input);
      if (!parsed.ok) throw new Error(`The scenario is not valid: ${parsed.problems.map((p) => `${p.path} ${p.message}`).join("; ")}`);
      return holidayTradeoff(parsed.scenario, seed, iterations);
    },
    async validate(input) {
      const parsed = parseScenario(input);
      return parsed.ok ? [] : parsed.problems;
    },
  };
}

/** The typed arrays' buffers of partial runs, to hand over between threads instead of copying them. */
export function partialBuffers(parts: PartialRun[]): ArrayBuffer[] {
  const out = new Set<ArrayBuffer>();
  for (const p of parts)
    for (const v of Object.values(p)) if (ArrayBuffer.isView(v) && v.buffer instanceof ArrayBuffer) out.add(v.buffer);
  return [...out];
}
