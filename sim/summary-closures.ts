/**
 * The closure part of a run summary (MODEL.md, "Closures that stand" and "Monte Carlo"): lane-closed hours
 * (total and by closure, P50/P80 over iterations, nearest rank), the share of iterations in which a standing
 * closure stood in a winter, and — for the representative iteration, right after it was simulated — its
 * closure timeline (local ISO times) and its lane-closed hours day by day. Plain JSON out.
 */
import { formatDayNumber, formatHours } from "./dates";
import type { CompiledScenario } from "./engine";
import type { PartialRun } from "./montecarlo";
import { nearestRank, sortedCopy } from "./percentiles";
import type { ClosurePeriodSummary, LaneClosedDay, LaneClosedHours } from "./run-summary-schema";

// The shapes are the run-result contract's (./run-summary-schema), so the two cannot drift apart.
export type { ClosurePeriodSummary, LaneClosedDay, LaneClosedHours } from "./run-summary-schema";

const round = (x: number, digits: number) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};

/** Percentiles over iterations; `byDay` is filled from the representative (`representativeClosures`). */
export function laneClosedSummary(c: CompiledScenario, p: PartialRun): { laneClosedHours: LaneClosedHours; winterStandingShare: number } {
  const n = p.finish.length;
  const q = (values: Float64Array) => {
    const s = sortedCopy(values);
    return { p50: round(nearestRank(s, 0.5), 1), p80: round(nearestRank(s, 0.8), 1) };
  };
  const byClosure = c.timelineClosures
    .map((cl, j) => {
      const col = new Float64Array(n);
      for (let k = 0; k < n; k++) col[k] = p.laneClosedByClosure[k * p.nClosures + j];
      return { closure: cl.id, name: cl.name, kind: cl.kind, lanes: cl.lanes, ...q(col) };
    })
    .filter((x) => x.lanes.length > 0);
  let winters = 0;
  for (let k = 0; k < n; k++) winters += p.winterStanding[k];
  return { laneClosedHours: { total: q(p.laneClosedHours), byClosure, byDay: [] }, winterStandingShare: n ? round(winters / n, 4) : 0 };
}

/** The timeline and the by-day lane-closed hours of the iteration `simulate` just ran on `c`. */
export function representativeClosures(c: CompiledScenario): { timeline: ClosurePeriodSummary[]; byDay: LaneClosedDay[] } {
  const tl = c.timeline;
  const day0 = c.calendar.startDay;
  const timeline: ClosurePeriodSummary[] = [];
  const p = tl.periods;
  tl.closures.forEach((cl, j) => {
    for (let k = 0; k < p.counts[j]; k++)
      timeline.push({ closure: cl.id, name: cl.name, kind: cl.kind, lanes: cl.lanes, start: formatHours(day0, p.starts[j][k]), end: formatHours(day0, p.ends[j][k]) });
  });
  // Chronological, ties by closure order (the sort is stable).
  const startOf = new Map(timeline.map((x) => [x, x.start]));
  timeline.sort((a, b) => (startOf.get(a)! < startOf.get(b)! ? -1 : startOf.get(a)! > startOf.get(b)! ? 1 : 0));
  const d = tl.byDay();
  const byDay: LaneClosedDay[] = [];
  for (let day = Math.max(0, d.first); day <= d.last; day++) {
    if (!(d.total[day] > 0)) continue;
    const byClosure: Record<string, number> = {};
    tl.closures.forEach((cl, j) => {
      const h = d.byClosure[j][day];
      if (h > 0) byClosure[cl.id] = round(h, 3);
    });
    byDay.push({ date: formatDayNumber(day0 + day), total: round(d.total[day], 3), byClosure });
  }
  return { timeline, byDay };
}
