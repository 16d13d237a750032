/** Rows of a plan search as the table and the chart use them (pure: unit-tested). */
import { parseIsoDate, formatDayNumber } from "@sim/dates";
import type { VariantRow } from "@/lib/search-contract";

export interface ChartPoint {
  idx: number;
  label: string;
  /** P80 finish as a day number (x). */
  finishDay: number;
  delay: number;
  cost: number | null;
  current: boolean;
  onFrontier: boolean;
}

/** Finished plans with a P80 finish date, as chart points (an unfinished P80 cannot be placed on a date axis). */
export function chartPoints(rows: readonly VariantRow[]): ChartPoint[] {
  return rows
    .filter((r) => r.status === "done" && r.outcome && r.outcome.p80Finish !== "unfinished")
    .map((r) => ({ idx: r.idx, label: r.label, finishDay: parseIsoDate(r.outcome!.p80Finish), delay: r.outcome!.delayVehHours ?? 0, cost: r.outcome!.contractCost, current: r.current, onFrontier: r.onFrontier }));
}

export const dayLabel = (d: number) => formatDayNumber(Math.round(d));

export interface RowFilter {
  /** Only plans whose P80 finish is on or before this date. */
  p80By: string | null;
  frontierOnly: boolean;
}

export function filterRows(rows: readonly VariantRow[], f: RowFilter): VariantRow[] {
  return rows.filter((r) => {
    if (f.frontierOnly && !r.onFrontier && !r.current) return false;
    if (f.p80By) return !!r.outcome && r.outcome.p80Finish !== "unfinished" && r.outcome.p80Finish <= f.p80By;
    return true;
  });
}

/** A cost scale for the bubble colour: 0 (cheapest) … 1 (dearest) among the points; null without costs. */
export function costShade(points: readonly ChartPoint[]): (cost: number | null) => number | null {
  const costs = points.map((p) => p.cost).filter((c): c is number => c !== null);
  if (costs.length === 0) return () => null;
  const lo = Math.min(...costs);
  const hi = Math.max(...costs);
  return (c) => (c === null ? null : hi > lo ? (c - lo) / (hi - lo) : 0.5);
}
