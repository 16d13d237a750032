/**
 * The closure timeline of the representative iteration (RunSummary.representative.closureTimeline) as rows
 * for a strip under the time–distance chart. Contract: one row per closure that has periods — stages'
 * standing closures first (in timeline order), then short-term closures — with its periods as [x1, x2) in
 * chart day numbers, clipped to the chart's [lo, hi]; and `lanesClosed`, the union of lanes closed at each
 * moment as consecutive segments (a lane closed by two closures at once counts once, as in lane-closed hours).
 */
import type { ClosurePeriodSummary } from "@sim/summary-closures";
import { isoToDay } from "./date-axis";

export interface ClosureRow {
  closure: string;
  name: string;
  kind: "standing" | "short";
  lanes: string[];
  bars: { x1: number; x2: number }[];
  /** Periods in the whole timeline (also those outside the chart's range). */
  periods: number;
  /** Lane-hours over the whole timeline: Σ |lanes| · duration. */
  laneHours: number;
  first: string;
  last: string;
}

export interface LaneSegment {
  x1: number;
  x2: number;
  lanes: string[];
}

interface Span {
  p: ClosurePeriodSummary;
  a: number;
  b: number;
}

function spans(timeline: readonly ClosurePeriodSummary[]): Span[] {
  const out: Span[] = [];
  for (const p of timeline) {
    const a = isoToDay(p.start);
    const b = isoToDay(p.end);
    if (a === null || b === null || !(b > a)) continue;
    out.push({ p, a, b });
  }
  return out;
}

export function closureRows(timeline: readonly ClosurePeriodSummary[], lo: number, hi: number): ClosureRow[] {
  const rows = new Map<string, ClosureRow>();
  for (const { p, a, b } of spans(timeline)) {
    let row = rows.get(p.closure);
    if (!row) {
      row = { closure: p.closure, name: p.name, kind: p.kind, lanes: p.lanes, bars: [], periods: 0, laneHours: 0, first: p.start, last: p.end };
      rows.set(p.closure, row);
    }
    row.periods++;
    row.laneHours += p.lanes.length * (b - a) * 24;
    if (p.start < row.first) row.first = p.start;
    if (p.end > row.last) row.last = p.end;
    const x1 = Math.max(lo, a);
    const x2 = Math.min(hi, b);
    if (x2 > x1) row.bars.push({ x1, x2 });
  }
  const list = [...rows.values()];
  return [...list.filter((r) => r.kind === "standing"), ...list.filter((r) => r.kind === "short")];
}

/** The lanes closed at each moment (union over closures), as segments where the set does not change. */
export function lanesClosed(timeline: readonly ClosurePeriodSummary[], lo: number, hi: number): LaneSegment[] {
  const events: { x: number; lanes: string[]; d: 1 | -1 }[] = [];
  for (const { p, a, b } of spans(timeline)) {
    const x1 = Math.max(lo, a);
    const x2 = Math.min(hi, b);
    if (!(x2 > x1)) continue;
    events.push({ x: x1, lanes: p.lanes, d: 1 }, { x: x2, lanes: p.lanes, d: -1 });
  }
  // Ends before starts at the same moment: periods are half-open.
  events.sort((e, f) => e.x - f.x || e.d - f.d);
  const count = new Map<string, number>();
  const out: LaneSegment[] = [];
  for (let k = 0; k < events.length; k++) {
    const e = events[k];
    for (const l of e.lanes) count.set(l, (count.get(l) ?? 0) + e.d);
    const next = events[k + 1];
    if (!next || next.x <= e.x) continue;
    const lanes = [...count.entries()].filter(([, c]) => c > 0).map(([l]) => l).sort();
    if (lanes.length === 0) continue;
    const last = out[out.length - 1];
    if (last && last.x2 === e.x && last.lanes.join() === lanes.join()) last.x2 = next.x;
    else out.push({ x1: e.x, x2: next.x, lanes });
  }
  return out;
}
