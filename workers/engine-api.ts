/**
 * What one engine worker offers. The same object runs inside a Web Worker (through comlink) and, in tests,
 * in-process, so the pool logic is tested with the real engine.
 */
import { compileScenario, holidayTradeoff, mergePartials, runIterations, summarizeRun, type HolidayTradeoff, type PartialRun, type RunSummary } from "../sim/index";
import { parseScenario } from "../sim/validate";
import type { FieldProblem } from "../sim/schema";

export type ProgressFn = (done: number) => void;

export interface EngineApi {
  runRange(input: unknown, seed: string, from: number, to: number, onProgress: ProgressFn): Promise<PartialRun>;
  summarize(input: unknown, parts: PartialRun[]): Promise<RunSummary>;
  validate(input: unknown): Promise<FieldProblem[]>;
  /** The holiday trade-off: the same seed and iterations under "stand down" and "work through". */
  tradeoff(input: unknown, seed: string, iterations: number): Promise<HolidayTradeoff>;
}

const PROGRESS_EVERY_MS = 150;

function compiledFrom(input: unknown) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(`The scenario is not valid: ${parsed.problems.map((p) => `${p.path} ${p.message}`).join("; ")}`);
  return compileScenario(parsed.scenario);
}

export function createEngineApi(now: () => number = () => Date.now()): EngineApi {
  return {
    async runRange(input, seed, from, to, onProgress) {
      const compiled = compiledFrom(input);
      let last = now();
      const partial = runIterations(compiled, seed, from, to, (done: number) => {
        const t = now();
        if (t - last >= PROGRESS_EVERY_MS) {
          last = t;
          onProgress(done);
        }
      });
      onProgress(to - from);
      return partial;
    },
    async summarize(input, parts) {
      const compiled = compiledFrom(input);
      return summarizeRun(compiled, mergePartials(parts));
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
