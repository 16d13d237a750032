/**
 * V8's inlining budgets for a Node process that runs the engine: the job worker (and its engine threads,
 * which share the process's V8 settings), the CLI and the bench's server figure. Why: the engine's hot path
 * is many small steps in a few large functions (the schedule loop, a pour, a weather day), and V8's default
 * budgets (a callee of at most 460 bytes of bytecode, 920 in all per optimized function) leave most of them
 * as calls; with these budgets the same code runs 25–35 % faster on every demo (measured with
 * `npm run bench`, which prints both figures). Results do not change: inlining is an optimization of the
 * same JavaScript (the golden runs are the same bit for bit either way). Browsers keep their own defaults,
 * as a page cannot set V8 flags. Call it first thing in the process, before engine code gets hot:
 * code optimized before the call keeps the budgets it was compiled with. POURLINE_V8_DEFAULTS=1 leaves V8 as
 * it is (to compare).
 */
import v8 from "node:v8";

export const ENGINE_V8_FLAGS = ["--max-inlined-bytecode-size=1000", "--max-inlined-bytecode-size-cumulative=5000"] as const;

/** Sets ENGINE_V8_FLAGS on this process (unless POURLINE_V8_DEFAULTS=1); returns whether it did. */
export function tuneV8ForEngine(env: Record<string, string | undefined> = process.env): boolean {
  if (env.POURLINE_V8_DEFAULTS === "1") return false;
  for (const flag of ENGINE_V8_FLAGS) v8.setFlagsFromString(flag);
  return true;
}
