/**
 * What is stored about a run besides its full summary: the headline figures lists and compare need, and the
 * hash of the inputs that produced it (so a stored run can be matched to the scenario version it belongs to).
 */
import { buildAsBuilt, compileScenario, runIterations, summarizeRun, type AsBuiltState, type ProgressRecord } from "@sim/index";
import type { Scenario } from "@sim/schema";
import { weatherOverride, type HourlyInput } from "@sim/forecast-weather";
import type { RunSummary } from "@sim/summary";

export interface RunHeadline {
  iterations: number;
  finish: { p10: string; p50: string; p80: string; p90: string };
  targetDate: string | null;
  targetProbability: number | null;
  /** Lane-closed hours, P50 (the closure timeline). */
  closureHoursTotal: number;
  weatherLostShiftsP50: number;
}

export function headlineOf(s: RunSummary): RunHeadline & Record<string, unknown> {
  const closureHoursTotal = s.laneClosedHours.total.p50;
  return {
    iterations: s.iterations,
    finish: { p10: s.finish.p10, p50: s.finish.p50, p80: s.finish.p80, p90: s.finish.p90 },
    targetDate: s.target?.date ?? null,
    targetProbability: s.target?.probability ?? null,
    closureHoursTotal,
    weatherLostShiftsP50: s.weatherLostShifts.p50,
  };
}

/** Key-sorted JSON, so the hash does not depend on property order. */
export function stableStringify(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stableStringify).join(",")}]`;
  if (v && typeof v === "object") {
    return `{${Object.keys(v as object)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stableStringify((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v);
}

/** cyrb53 twice with different seeds (106 bits): an identity check, not a security measure. */
function cyrb53(str: string, seed: number): string {
  let h1 = 0xdeadbeef ^ seed;
  let h2 = 0x41c6ce57 ^ seed;
  for (let i = 0; i < str.length; i++) {
    const ch = str.charCodeAt(i);
    h1 = Math.imul(h1 ^ ch, 2654435761);
    h2 = Math.imul(h2 ^ ch, 1597334677);
  }
  h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
  h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
  return (4294967296 * (2097151 & h2) + (h1 >>> 0)).toString(16).padStart(14, "0");
}

export function inputsHash(definition: unknown, seed: string, iterations: number): string {
  const text = stableStringify({ definition, seed, iterations });
  return cyrb53(text, 1) + cyrb53(text, 2);
}

/** A stored run as the results view shows it: stale (the data layer's rule) when the plan was saved again after the run. */
export function resultsRunOf(run: { id: string; iterations: number; seed: string; createdAt: Date; createdByName: string | null; stale: boolean }) {
  return { id: run.id, iterations: run.iterations, seed: run.seed, createdAt: run.createdAt.toISOString(), createdByName: run.createdByName ?? "", stale: run.stale };
}

/** What a re-forecast stores about its as-built state beside the run summary. */
export function asBuiltDigest(plan: Scenario, st: AsBuiltState) {
  const mean = (a: number[]) => (a.length ? a.reduce((x, y) => x + y, 0) / a.length : 0);
  return {
    dataDate: st.dataDate,
    entriesUsed: st.entriesUsed,
    operations: st.ops.map((o, i) => ({
      id: o.id,
      name: plan.operations[i].name,
      donePackets: o.remaining.filter((r) => r === 0).length,
      partPackets: o.remaining.filter((r) => r > 0 && r < 1).length,
      packets: o.remaining.length,
    })),
    curingPackets: st.curing.length,
    discovered: st.discovered,
    discovery: { priorPackets: st.discovery.priorPackets, inspected: st.discovery.inspected, found: st.discovery.found, planMean: mean(st.discovery.prior), updatedMean: mean(st.discovery.updated) },
  };
}

/** The columns of a stored plan run (no data date), computed here so the app and the demo seed store alike. */
export function planRunRecord(args: { plan: Scenario; definition: unknown; seed: string; iterations: number }) {
  const started = Date.now();
  const compiled = compileScenario(args.plan);
  const summary = summarizeRun(compiled, runIterations(compiled, args.seed, 0, args.iterations));
  return storedRun({ definition: args.definition, seed: args.seed, iterations: args.iterations, summary, durationMs: Date.now() - started });
}

/** A stored run's columns from a summary (the browser's, checked, or the server's own). */
export function storedRun(args: { definition: unknown; seed: string; iterations: number; summary: RunSummary; durationMs: number }) {
  return {
    inputsHash: inputsHash(args.definition, args.seed, args.iterations),
    seed: args.seed,
    iterations: args.iterations,
    summary: headlineOf(args.summary),
    results: args.summary,
    durationMs: args.durationMs,
  };
}

/** The weather forecast a re-forecast starts from: its hours, and when it was fetched (which names it). */
export interface ForecastInput {
  fetchedAt: string;
  generatedAt: string | null;
  hourly: HourlyInput;
}

/**
 * The inputs hash of a re-forecast: the definition, the field records up to the data date, the data date and,
 * when it starts from one, the weather forecast (absent otherwise, so a re-forecast without one keeps its hash).
 */
export function reforecastInputsHash(args: { definition: unknown; records: ReadonlyArray<ProgressRecord>; dataDate: string; seed: string; iterations: number; forecast?: ForecastInput | null }) {
  const used = args.records.filter((r) => r.workDate <= args.dataDate);
  const forecast = args.forecast ? { forecast: { fetchedAt: args.forecast.fetchedAt, hourly: args.forecast.hourly } } : {};
  return inputsHash({ definition: args.definition, progress: used, dataDate: args.dataDate, ...forecast }, args.seed, args.iterations);
}

/** What the stored re-forecast says about its weather forecast (beside `forecastDates` in the summary). */
export const weatherForecastDigest = (f: ForecastInput) => ({ fetchedAt: f.fetchedAt, generatedAt: f.generatedAt });

export type AsBuiltDigest = ReturnType<typeof asBuiltDigest>;

/** A stored re-forecast's columns from its summary and as-built digest (the engine worker's or the seed's). */
export function storedReforecast(args: {
  definition: unknown;
  records: ReadonlyArray<ProgressRecord>;
  dataDate: string;
  seed: string;
  iterations: number;
  summary: RunSummary;
  reforecast: AsBuiltDigest;
  durationMs: number;
  forecast?: ForecastInput | null;
}) {
  const headline = headlineOf(args.summary);
  const digest = args.forecast ? { ...args.reforecast, weatherForecast: weatherForecastDigest(args.forecast) } : args.reforecast;
  return {
    inputsHash: reforecastInputsHash(args),
    seed: args.seed,
    iterations: args.iterations,
    dataDate: args.dataDate,
    summary: { ...headline, dataDate: args.dataDate } as Record<string, unknown>,
    results: { ...args.summary, reforecast: digest },
    durationMs: args.durationMs,
    headline,
    reforecast: digest,
  };
}

/**
 * The columns of a stored re-forecast: the engine from the as-built state at the data date (records dated
 * after it are ignored). The engine worker and the demo seed both store exactly this.
 */
export function reforecastRunRecord(args: { plan: Scenario; definition: unknown; records: ReadonlyArray<ProgressRecord>; dataDate: string; seed: string; iterations: number; forecast?: ForecastInput | null }) {
  const started = Date.now();
  const asBuilt = buildAsBuilt(args.plan, args.records, args.dataDate);
  const override = args.forecast ? weatherOverride(args.plan, args.forecast.hourly, args.dataDate) : null;
  const compiled = compileScenario(args.plan, { asBuilt, weatherOverride: override });
  const summary = summarizeRun(compiled, runIterations(compiled, args.seed, 0, args.iterations));
  return storedReforecast({ ...args, summary, reforecast: asBuiltDigest(args.plan, asBuilt), durationMs: Date.now() - started });
}
