/** A run as CSV (through ./csv, which neutralises formula-like text): percentiles overall and per operation, or the representative trace. */
import { toCsv } from "./csv";
import type { RunSummary } from "@sim/index";
import { formatHours, parseIsoDate } from "@sim/dates";

export function percentilesCsv(s: RunSummary): string {
  const rows = [
    { item: "overall", name: "Whole job", p10: s.finish.p10, p50: s.finish.p50, p80: s.finish.p80, p90: s.finish.p90 },
    ...s.operations.map((o) => ({ item: o.id, name: o.name, ...o.finish })),
  ];
  return toCsv(rows, { columns: ["item", "name", "p10", "p50", "p80", "p90"] });
}

export function traceCsv(s: RunSummary, definition: { startDate: string; deck: { startStationFt: number; packetFt: number; lengthFt: number } }): string {
  const day0 = parseIsoDate(definition.startDate);
  const { startStationFt, packetFt, lengthFt } = definition.deck;
  const rows = s.representative.trace.packets.map((t) => ({
    operation: t.op,
    packet: t.packet,
    crew: t.crew < 0 ? "" : t.crew + 1,
    station_from_ft: startStationFt + t.packet * packetFt,
    station_to_ft: startStationFt + Math.min((t.packet + 1) * packetFt, lengthFt),
    mobilized_from: t.mobilizedFrom === undefined ? "" : formatHours(day0, t.mobilizedFrom),
    start: formatHours(day0, t.start),
    finish: formatHours(day0, t.finish),
    paused_hours: s.representative.trace.pauses.filter((p) => p.op === t.op && p.packet === t.packet && p.crew === t.crew).reduce((a, p) => a + (p.end - p.start), 0).toFixed(2),
  }));
  return toCsv(rows);
}
