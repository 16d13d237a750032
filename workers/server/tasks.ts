/**
 * What an engine thread computes, one task at a time: plain data in, plain data out (it crosses a thread
 * boundary). The same sim/ code the browser runs; nothing here touches the database.
 */
import { isDeepStrictEqual } from "node:util";
import { buildAsBuilt, compileScenario, parseScenario, runIterations, summarizeRun, type ProgressRecord, type RunSummary } from "../../sim/index";
import { outcomeOf, type PlanOutcome } from "../../sim/frontier";
import { runSummarySchema } from "../../sim/run-summary-schema";
import { weatherFeasibility } from "../../sim/feasibility";
import { asBuiltDigest } from "../../src/lib/run-record";
import { weatherOverride, type HourlyInput } from "../../sim/forecast-weather";

export type EngineTask =
  | { kind: "run"; definition: unknown; seed: string; iterations: number }
  | { kind: "reforecast"; definition: unknown; seed: string; iterations: number; dataDate: string; records: ProgressRecord[]; forecast?: HourlyInput | null }
  | { kind: "verify"; definition: unknown; seed: string; iterations: number; claimed: unknown }
  | { kind: "variant"; definition: unknown; seed: string; iterations: number; fromFieldLog?: { dataDate: string; records: ProgressRecord[] } | null };

export type TaskResult =
  | { kind: "run"; summary: RunSummary }
  | { kind: "reforecast"; summary: RunSummary; reforecast: ReturnType<typeof asBuiltDigest> }
  | { kind: "verify"; summary: RunSummary; matches: boolean; firstDifference: string | null }
  | { kind: "variant"; outcome: PlanOutcome }
  | { kind: "infeasible"; problem: string };

export type Progress = (done: number) => void;

/** The first path where two JSON values differ, for the log of a rejected run. */
export function firstDifference(a: unknown, b: unknown, path = "summary"): string | null {
  if (isDeepStrictEqual(a, b)) return null;
  if (a && b && typeof a === "object" && typeof b === "object" && Array.isArray(a) === Array.isArray(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys) {
      const d = firstDifference((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`);
      if (d) return d;
    }
  }
  return path;
}

/** A summary as it reads back from JSON (and so from the database): what a stored summary is compared with. */
const asJson = <T>(v: T): unknown => JSON.parse(JSON.stringify(v));

/**
 * What the worker stores is held to the same run-result contract as a browser's summary (checked as it will
 * read back from JSON); a summary outside it is an engine error, and the job fails saying where.
 */
function withinContract(summary: RunSummary): RunSummary {
  const checked = runSummarySchema.safeParse(asJson(summary));
  if (!checked.success) {
    const where = checked.error.issues.slice(0, 3).map((i) => `${i.path.join(".") || "summary"}: ${i.message}`);
    throw new Error(`the engine's summary is outside the run-result contract (${where.join("; ")})`);
  }
  return summary;
}

export function runTask(task: EngineTask, onProgress: Progress): TaskResult {
  const parsed = parseScenario(task.definition);
  if (!parsed.ok) return { kind: "infeasible", problem: parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ") };
  const plan = parsed.scenario;
  // A plan the weather never lets finish would only run every iteration to the horizon.
  const never = weatherFeasibility(plan);
  if (never.length) return { kind: "infeasible", problem: never.map((p) => p.message).join("; ") };
  if (task.kind === "reforecast") {
    const asBuilt = buildAsBuilt(plan, task.records, task.dataDate);
    // From the weather forecast when the job carries one (MODEL.md, "Re-forecast from the weather forecast").
    const override = task.forecast ? weatherOverride(plan, task.forecast, task.dataDate) : null;
    const compiled = compileScenario(plan, { asBuilt, weatherOverride: override });
    const summary = summarizeRun(compiled, runIterations(compiled, task.seed, 0, task.iterations, onProgress));
    return { kind: "reforecast", summary: withinContract(summary), reforecast: asBuiltDigest(plan, asBuilt) };
  }
  // A plan of a search from the field log starts, as a re-forecast does, from the as-built state at the data date.
  const from = task.kind === "variant" ? task.fromFieldLog : null;
  const compiled = compileScenario(plan, from ? { asBuilt: buildAsBuilt(plan, from.records, from.dataDate) } : undefined);
  const summary = summarizeRun(compiled, runIterations(compiled, task.seed, 0, task.iterations, onProgress));
  if (task.kind === "variant") return { kind: "variant", outcome: outcomeOf(summary) };
  if (task.kind === "verify") {
    // Same scenario version, seed and iterations ⇒ the same numbers (iteration k draws from "seed:k"), so
    // anything but exact equality means the stored summary is not what the engine computes.
    const diff = firstDifference(asJson(summary), task.claimed);
    return { kind: "verify", summary, matches: diff === null, firstDifference: diff };
  }
  return { kind: "run", summary: withinContract(summary) };
}
