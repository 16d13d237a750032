/**
 * The field log as CSV (through ./csv, which neutralises formula-like text): one row per recorded shift in the
 * order worked, with names beside ids so the file reads without the plan, stations both in feet and as
 * stations, and who recorded it and when it last changed — what an owner's office files or totals quantities
 * from. Deleted shifts are not in it (they are on the Field log, under "Deleted shifts") — unless asked for: the
 * record as an auditor reads it, every shift ever entered in the order worked, each marked recorded or deleted (by
 * whom, when), so the export that totals quantities and the one that accounts for every entry are not confused.
 */
import { toCsv } from "./csv";
import { formatStation } from "@/lib/format";
import { DISCOVERED_LABELS } from "@/lib/progress-schema";
import type { ProgressEntry } from "@sim/progress-entry";

export interface FieldLogRow extends ProgressEntry {
  enteredByName: string | null;
  createdAt: Date | string;
  updatedAt: Date | string;
  version: number;
}

export interface FieldLogNames {
  operations: Record<string, string>;
  shifts: Record<string, string>;
}

const iso = (d: Date | string) => (typeof d === "string" ? d : d.toISOString());

export const FIELD_LOG_COLUMNS = [
  "work_date", "shift", "operation", "operation_name", "station_from", "station_to", "station_from_ft", "station_to_ft", "length_ft",
  "crew", "temp_f", "rain", "lost_hours", "lost_reason", "discovered", "recorded_by", "recorded_at", "last_changed_at", "version",
];

/** The columns the export with deleted shifts adds after the others. */
export const DELETED_COLUMNS = ["status", "deleted_by", "deleted_at"];

export interface DeletedFieldLogRow extends FieldLogRow {
  deletedByName: string | null;
  deletedAt: Date | string | null;
}

/** `deleted`: the deleted shifts too, every shift in the order worked (then as entered), marked. */
export function fieldLogCsv(rows: FieldLogRow[], names: FieldLogNames, { deleted }: { deleted?: DeletedFieldLogRow[] } = {}): string {
  if (deleted) {
    const marked = [
      ...rows.map((r) => ({ r, mark: { status: "recorded", deleted_by: "", deleted_at: "" } })),
      ...deleted.map((r) => ({ r, mark: { status: "deleted", deleted_by: r.deletedByName ?? "", deleted_at: r.deletedAt ? iso(r.deletedAt) : "" } })),
    ].sort((a, b) => a.r.workDate.localeCompare(b.r.workDate) || iso(a.r.createdAt).localeCompare(iso(b.r.createdAt)));
    return toCsv(marked.map(({ r, mark }) => ({ ...fieldLogRow(r, names), ...mark })), { columns: [...FIELD_LOG_COLUMNS, ...DELETED_COLUMNS] });
  }
  return toCsv(rows.map((r) => fieldLogRow(r, names)), { columns: FIELD_LOG_COLUMNS });
}

function fieldLogRow(r: FieldLogRow, names: FieldLogNames) {
  return {
    work_date: r.workDate,
    shift: names.shifts[r.shift] ?? r.shift,
    operation: r.operationId,
    operation_name: names.operations[r.operationId] ?? r.operationId,
    station_from: formatStation(r.fromStationFt),
    station_to: formatStation(r.toStationFt),
    station_from_ft: r.fromStationFt,
    station_to_ft: r.toStationFt,
    length_ft: r.toStationFt - r.fromStationFt,
    crew: r.crew,
    temp_f: r.tempF ?? "",
    rain: r.rain ? "yes" : "no",
    lost_hours: r.lostHours,
    lost_reason: r.lostReason,
    // One cell for the shift's conditions: "Bottom-mat exposure STA 1+00–STA 1+50 (12 ft²); …".
    discovered: r.discovered
      .map((d) => `${DISCOVERED_LABELS[d.kind as keyof typeof DISCOVERED_LABELS] ?? d.kind} ${formatStation(d.fromStationFt)}–${formatStation(d.toStationFt)} (${d.areaSqFt} ft²)`)
      .join("; "),
    recorded_by: r.enteredByName ?? "",
    recorded_at: iso(r.createdAt),
    last_changed_at: iso(r.updatedAt),
    version: r.version,
  };
}
