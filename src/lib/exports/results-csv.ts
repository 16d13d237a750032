/**
 * A run as CSV (through ./csv, which neutralises formula-like text): percentiles overall, per stage (its
 * restoration) and per operation (its last packet over every stage), or the representative trace with each
 * packet's stage. Runs stored before stages existed have no stage rows and an empty stage column.
 */
import { toCsv } from "./csv";
import type { RunSummary } from "@sim/index";
import { formatHours, parseIsoDate } from "@sim/dates";

export function percentilesCsv(s: RunSummary): string {
  const rows = [
    { kind: "overall", stage: "", item: "overall", name: "Whole job", p10: s.finish.p10, p50: s.finish.p50, p80: s.finish.p80, p90: s.finish.p90 },
    ...(s.stages ?? []).map((st) => ({ kind: "stage", stage: st.id, item: st.id, name: `${st.name} (restored; lanes ${st.lanes.join(" ")})`, ...st.finish })),
    ...s.operations.map((o) => ({ kind: "operation", stage: "all", item: o.id, name: o.name, ...o.finish })),
  ];
  return toCsv(rows, { columns: ["kind", "stage", "item", "name", "p10", "p50", "p80", "p90"] });
}

export function traceCsv(s: RunSummary, definition: { startDate: string; deck: { startStationFt: number; packetFt: number; lengthFt: number } }): string {
  const day0 = parseIsoDate(definition.startDate);
  const { startStationFt, packetFt, lengthFt } = definition.deck;
  const { packets, pauses } = s.representative.trace;
  const rows = packets.map((t) => ({
    stage: t.stage ?? "",
    operation: t.op,
    packet: t.packet,
    crew: t.crew < 0 ? "" : t.crew + 1,
    station_from_ft: startStationFt + t.packet * packetFt,
    station_to_ft: startStationFt + Math.min((t.packet + 1) * packetFt, lengthFt),
    mobilized_from: t.mobilizedFrom === undefined ? "" : formatHours(day0, t.mobilizedFrom),
    start: formatHours(day0, t.start),
    finish: formatHours(day0, t.finish),
    // The same operation works the same packet once per stage: a pause belongs to its own stage's packet.
    paused_hours: pauses.filter((p) => p.op === t.op && p.packet === t.packet && p.crew === t.crew && p.stage === t.stage).reduce((a, p) => a + (p.end - p.start), 0).toFixed(2),
  }));
  return toCsv(rows, { columns: ["stage", "operation", "packet", "crew", "station_from_ft", "station_to_ft", "mobilized_from", "start", "finish", "paused_hours"] });
}
