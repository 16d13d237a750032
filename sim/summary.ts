/**
 * The JSON summary of a run (plain objects and numbers only: it crosses workers, the API and the database).
 * Contract: percentiles are nearest-rank (./percentiles); dates are local ISO (`YYYY-MM-DD`, or
 * `YYYY-MM-DDTHH:mm` where a time is useful); "unfinished" marks a percentile reached only by iterations
 * that hit the engine's horizon. The histogram (≤ 60 bins) and CDF (≤ 200 points) are computed here, so a
 * chart only draws. The representative iteration is re-simulated with its trace.
 * With a traffic or costs section: `delay`, `cost` (P50/P80; null where the input is missing or a
 * percentile is reached only by unfinished iterations) and `traffic` (the representative day by day).
 * Without them these keys are absent, so such summaries are unchanged. The type and its strict check are
 * `./run-summary-schema` (the run-result contract).
 */
import { impactModel, iterationImpact, type ImpactDetail, type ImpactModel } from "./cost";
import { formatDayNumber, formatHours, parseIsoDate } from "./dates";
import { simulate, type CompiledScenario, type Trace } from "./engine";
import type { PartialRun } from "./montecarlo";
import { nearestRank, sortedCopy } from "./percentiles";
import { drawSamples } from "./samples";
import { laneClosedSummary, representativeClosures } from "./summary-closures";
import type { DateQuantiles, NumberQuantiles, RunSummary, TrafficDay, TrafficDetail } from "./run-summary-schema";

export type { RunSummary, DateQuantiles, NumberQuantiles, TrafficDay, TrafficDetail } from "./run-summary-schema";

// Compile-time guard: the engine's trace and the contract's trace are the same shape.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const traceMatchesContract: Same<Trace, RunSummary["representative"]["trace"]> = true;
void traceMatchesContract;

const UNFINISHED = "unfinished";

export function summarizeRun(compiled: CompiledScenario, partial: PartialRun): RunSummary {
  const s = compiled.scenario;
  const day0 = compiled.calendar.startDay;
  const n = partial.finish.length;
  if (n === 0) throw new Error("summarizeRun needs at least one iteration");
  const date = (h: number) => (h < Infinity ? formatDayNumber(day0 + Math.floor(h / 24)) : UNFINISHED);
  const dateTime = (h: number) => (h < Infinity ? formatHours(day0, h) : UNFINISHED);
  const sorted = sortedCopy(partial.finish);
  const q = (arr: Float64Array, f: (h: number) => string): DateQuantiles => ({
    p10: f(nearestRank(arr, 0.1)), p50: f(nearestRank(arr, 0.5)), p80: f(nearestRank(arr, 0.8)), p90: f(nearestRank(arr, 0.9)),
  });

  const operations = s.operations.map((op, oi) => {
    const col = new Float64Array(n);
    for (let j = 0; j < n; j++) col[j] = partial.opFinish[j * partial.nOps + oi];
    return { id: op.id, name: op.name, finish: q(col.sort(), date) };
  });
  const stages = compiled.stages.map((st, si) => {
    const col = new Float64Array(n);
    for (let j = 0; j < n; j++) col[j] = partial.stageFinish[j * partial.nStages + si];
    return { id: st.id, name: st.name, lanes: st.lanes, finish: q(col.sort(), date) };
  });

  let unfinishedIterations = 0;
  for (let j = 0; j < n; j++) if (!(partial.finish[j] < Infinity)) unfinishedIterations++;

  const target = s.targetDate
    ? (() => {
        const limit = 24 * (parseIsoDate(s.targetDate!) - day0 + 1);
        let met = 0;
        for (let j = 0; j < n; j++) if (partial.finish[j] <= limit) met++;
        return { date: s.targetDate!, probability: n ? met / n : 0 };
      })()
    : null;

  const lost = sortedCopy(partial.weatherLostShifts);
  const disc = sortedCopy(partial.discoveredHours);
  const p50 = nearestRank(sorted, 0.5);
  let convergenceDays: number | null = null;
  if (n >= 2) {
    const half = Math.floor(n / 2);
    const a = nearestRank(sortedCopy(partial.finish.subarray(0, half)), 0.8);
    const b = nearestRank(sortedCopy(partial.finish.subarray(half)), 0.8);
    convergenceDays = a < Infinity && b < Infinity ? Math.abs(a - b) / 24 : null;
  }

  let season1End: { p50: string } | null = null;
  if (s.calendar.season.plan === "two") {
    const e = sortedCopy(Array.from(partial.season1End).filter((x) => !Number.isNaN(x)));
    season1End = e.length ? { p50: dateTime(nearestRank(e, 0.5)) } : null;
  }

  const closures = laneClosedSummary(compiled, partial);
  const traffic = impactSummary(compiled, partial, p50, dateTime);
  const rep = representative(compiled, partial, p50, dateTime);
  closures.laneClosedHours.byDay = rep.byDay;
  return {
    scenarioName: s.name,
    seed: partial.seed,
    iterations: n,
    unfinishedIterations,
    startDate: s.startDate,
    finish: q(sorted, date),
    finishAt: q(sorted, dateTime),
    operations,
    stages,
    histogram: histogram(sorted, day0),
    cdf: cdf(sorted, dateTime),
    target,
    weatherLostShifts: { p50: nearestRank(lost, 0.5), p80: nearestRank(lost, 0.8) },
    discoveredHours: { p50: nearestRank(disc, 0.5), p80: nearestRank(disc, 0.8) },
    ...closures,
    convergenceDays,
    season1End,
    ...traffic,
    representative: rep.representative,
    ...(compiled.weatherOverride ? { forecastDates: compiled.weatherOverride.dates } : {}), // forecast override
  };
}

const round = (x: number, digits: number) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};

function numberQuantiles(values: Float64Array, digits: number): NumberQuantiles {
  const s = sortedCopy(values);
  const fin = (x: number) => (Number.isFinite(x) ? round(x, digits) : null);
  let sum = 0;
  for (const v of s) sum += v;
  return { p50: fin(nearestRank(s, 0.5)), p80: fin(nearestRank(s, 0.8)), mean: fin(sum / s.length) };
}

function impactSummary(c: CompiledScenario, p: PartialRun, p50: number, dateTime: (h: number) => string): Pick<RunSummary, "delay" | "cost" | "traffic"> {
  const m = impactModel(c);
  if (!m) return {};
  const out: Pick<RunSummary, "delay" | "cost" | "traffic"> = {};
  if (m.traffic) out.delay = { vehicleHours: numberQuantiles(p.delayVehHours, 1) };
  out.cost = {
    roadUser: m.traffic ? numberQuantiles(p.roadUserCost, 0) : null,
    contract: m.costs ? numberQuantiles(p.contractCost, 0) : null,
    valueOfTimeYear: m.votYear,
  };
  if (m.traffic) out.traffic = trafficDetail(c, m, p, representativeIndex(p, p50), dateTime);
  return out;
}

function trafficDetail(c: CompiledScenario, m: ImpactModel, p: PartialRun, best: number, dateTime: (h: number) => string): TrafficDetail {
  const k = p.from + best;
  const r = simulate(c, drawSamples(c.scenario, p.seed, k, undefined, c.weatherOverride)); // forecast override
  const detail: ImpactDetail = { perDirection: [] };
  const im = iterationImpact(c, m, r, detail);
  const t = m.traffic!;
  const day0 = c.calendar.startDay;
  const days: TrafficDay[] = [];
  let maxQueue: TrafficDetail["maxQueue"] = null;
  const nDays = c.calendar.days;
  const lane = c.timeline.byDay();
  for (let d = 0; d < nDays; d++) {
    const laneClosedHours: Record<string, number> = {};
    let any = false;
    c.timelineClosures.forEach((cl, j) => {
      const h = lane.byClosure[j][d];
      if (h > 0) {
        laneClosedHours[cl.id] = round(h, 3);
        any = true;
      }
    });
    let delay = 0;
    let bestMiles = 0;
    let bestVeh = 0;
    let bestMinutes = 0;
    let dir: string | null = null;
    let clears = NaN;
    t.directions.forEach((cd, i) => {
      const qd = detail.perDirection[i];
      delay += qd.delay[d];
      if (qd.peakDelayMinutes[d] > bestMinutes) bestMinutes = qd.peakDelayMinutes[d];
      const miles = (qd.peakQueue[d] * cd.pcPerVeh) / (t.jamDensity * cd.storageLanes);
      if (qd.peakQueue[d] > 0 && miles > bestMiles) {
        bestMiles = miles;
        bestVeh = qd.peakQueue[d];
        dir = cd.id;
        clears = qd.clearsAt[d];
      }
    });
    if (!any && delay <= 0) continue;
    const date = formatDayNumber(day0 + d);
    days.push({ date, laneClosedHours, delayVehHours: round(delay, 1), peakQueueVeh: Math.round(bestVeh), peakQueueMiles: round(bestMiles, 2), peakDelayMinutes: round(bestMinutes, 1), direction: dir, clearsAt: Number.isNaN(clears) ? null : dateTime(clears) });
    if (bestMiles > (maxQueue?.miles ?? 0)) maxQueue = { miles: round(bestMiles, 2), vehicles: Math.round(bestVeh), date };
  }
  const fin = (x: number) => (Number.isFinite(x) ? Math.round(x) : null);
  return {
    iteration: k,
    delayVehHours: round(im.delayVehHours, 1),
    roadUserCost: fin(im.roadUserCost),
    contractCost: fin(im.contractCost),
    workingDays: im.workingDays,
    jamDensityPcPerMiPerLane: t.jamDensity,
    maxQueue,
    days,
  };
}

function histogram(sorted: Float64Array, day0: number): RunSummary["histogram"] {
  const finished = sorted.filter((x) => x < Infinity);
  if (finished.length === 0) return [];
  const lo = Math.floor(finished[0] / 24);
  const hi = Math.floor(finished[finished.length - 1] / 24);
  const width = Math.max(1, Math.ceil((hi - lo + 1) / 60));
  const bins = Math.ceil((hi - lo + 1) / width);
  const counts = new Array<number>(bins).fill(0);
  for (const f of finished) counts[Math.floor((Math.floor(f / 24) - lo) / width)]++;
  return counts.map((count, b) => ({
    from: formatDayNumber(day0 + lo + b * width),
    to: formatDayNumber(day0 + lo + (b + 1) * width - 1),
    count,
  }));
}

function cdf(sorted: Float64Array, dateTime: (h: number) => string): RunSummary["cdf"] {
  const n = sorted.length;
  const m = Math.min(200, n);
  const out: RunSummary["cdf"] = [];
  for (let j = 1; j <= m; j++) {
    const idx = Math.ceil((j * n) / m) - 1;
    if (!(sorted[idx] < Infinity)) break;
    out.push({ date: dateTime(sorted[idx]), p: (idx + 1) / n });
  }
  return out;
}

function representativeIndex(p: PartialRun, p50: number): number {
  const n = p.finish.length;
  let best = 0;
  let bestGap = Infinity;
  for (let j = 0; j < n; j++) {
    const f = p.finish[j];
    const gap = f === p50 ? 0 : Math.abs(f - p50);
    if (gap < bestGap) {
      bestGap = gap;
      best = j;
    }
  }
  return best;
}

function representative(c: CompiledScenario, p: PartialRun, p50: number, dateTime: (h: number) => string): { representative: RunSummary["representative"]; byDay: RunSummary["laneClosedHours"]["byDay"] } {
  const k = p.from + representativeIndex(p, p50);
  const r = simulate(c, drawSamples(c.scenario, p.seed, k, undefined, c.weatherOverride), { trace: true }); // forecast override
  const cl = representativeClosures(c);
  return { representative: { iteration: k, finish: dateTime(r.finish), finishHours: r.finish, trace: r.trace!, closureTimeline: cl.timeline }, byDay: cl.byDay };
}
