/**
 * The representative trace split by stage, for one time–distance panel per stage. Contract: each stage (in
 * the plan's order, then stages only the trace names) gets the series of its own packets and pauses, drawn
 * by `timeDistanceSeries`; operations keep one index across stages so an operation looks the same in every
 * panel. A trace stored before stages existed (no packet names a stage) is one group with `stage: null`.
 */
import type { Trace } from "@sim/engine";
import { timeDistanceSeries, type DeckGeometry, type OperationSeries } from "./time-distance-series";

export interface StageInfo {
  id: string;
  name: string;
  lanes?: string[];
}

export interface StageGroup {
  stage: StageInfo | null;
  /** Series with something to draw or count, each with the operation's index in `operations` (its style). */
  series: (OperationSeries & { styleIndex: number })[];
}

export function seriesByStage(trace: Trace, deck: DeckGeometry, stages: StageInfo[], operations: { id: string; name: string }[], toX: (hours: number) => number): StageGroup[] {
  const ops = [...operations];
  for (const p of trace.packets) if (!ops.some((o) => o.id === p.op)) ops.push({ id: p.op, name: p.op });
  const styleOf = new Map(ops.map((o, i) => [o.id, i]));
  const keep = (list: OperationSeries[]) =>
    list.filter((s) => s.points.length > 0 || s.unfinishedPackets > 0).map((s) => ({ ...s, styleIndex: styleOf.get(s.id) ?? 0 }));

  if (!trace.packets.some((p) => p.stage !== undefined)) return [{ stage: null, series: keep(timeDistanceSeries(trace, deck, ops, toX)) }];

  const order = [...stages];
  for (const p of trace.packets) if (p.stage !== undefined && !order.some((s) => s.id === p.stage)) order.push({ id: p.stage, name: p.stage });
  return order.map((stage) => {
    const sub: Trace = { packets: trace.packets.filter((p) => p.stage === stage.id), pauses: trace.pauses.filter((p) => p.stage === stage.id) };
    const used = new Set(sub.packets.map((p) => p.op));
    return { stage, series: keep(timeDistanceSeries(sub, deck, ops.filter((o) => used.has(o.id)), toX)) };
  });
}
