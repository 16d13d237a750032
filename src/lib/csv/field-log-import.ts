/**
 * A field log read from a CSV file, for a job that comes to Pourline part-way through (its shifts so far are in a
 * spreadsheet, not to be typed one by one) or a log moved from one scenario to another. The columns are those of the
 * field log's own download (src/lib/exports/field-log-csv.ts), so a downloaded log loads back as it was: `work_date`,
 * `shift` (its name or id), `operation` (id) or `operation_name`, the stations in feet (`station_from_ft`,
 * `station_to_ft`) or as stations (`station_from`, `station_to`: 1250 or 12+50), and optionally `crew`, `temp_f`,
 * `rain` (yes/no), `lost_hours`, `lost_reason` and `discovered` ("Bottom-mat exposure STA 1+00–STA 1+50 (12 ft²); …").
 * Other columns are ignored; rows the audit download marks deleted are skipped. Every row goes through the entry
 * contract (sim/progress-entry.ts) and the field log's rules against the plan, the shifts already recorded and the
 * file's other rows (sim/progress-rules.ts) — the same checks as a shift recorded by hand — and each problem is named
 * by its line in the file and its column. Pure: the route reads the file and stores the shifts, all or none.
 */
import { readCsv, type RowProblem } from "./common";
import { checkProgressEntry, DISCOVERED_KINDS, DISCOVERED_LABELS, progressEntrySchema, type ProgressEntry, type RuleEntry } from "@/lib/progress-schema";
import type { Scenario } from "@sim/schema";
import type { ProgressImportPreview } from "@/lib/progress-contract";
import { progressToDate } from "@/lib/progress-to-date";

/** The most shifts one file may hold (a season of two shifts a day over every operation is well under it). */
export const MAX_IMPORT_SHIFTS = 5_000;

export interface ImportedShift {
  /** Its line in the file (the header is line 1). */
  line: number;
  entry: ProgressEntry;
}

export interface FieldLogImport {
  shifts: ImportedShift[];
  /** Rows the download with deleted shifts marks `deleted`: not part of the log, so not loaded. */
  skippedDeleted: number;
  problems: RowProblem[];
}

const COLUMNS = ["work_date", "shift", "operation", "operation_name", "station_from", "station_to", "station_from_ft", "station_to_ft", "crew", "temp_f", "rain", "lost_hours", "lost_reason", "discovered", "status"];

const YES = new Set(["yes", "y", "true", "1"]);
const NO = new Set(["no", "n", "false", "0", ""]);

/** "Bottom-mat exposure STA 1+00–STA 1+50 (12 ft²)" or "bottom-mat 100-150 (12)": one discovered condition. */
const CONDITION = /^(.+?)\s+((?:STA\s*)?[\d.,+]+)\s*[–—-]\s*((?:STA\s*)?[\d.,+]+)\s*\(\s*([\d.,]+)\s*(?:ft²|ft2|sq\.? ?ft)?\s*\)$/i;

function conditionKind(words: string): (typeof DISCOVERED_KINDS)[number] | null {
  const w = words.trim().toLowerCase();
  return DISCOVERED_KINDS.find((k) => k === w || DISCOVERED_LABELS[k].toLowerCase() === w) ?? null;
}

/** The entry's field → the column a problem with it names. */
function columnOf(path: PropertyKey[], stationsInFeet: boolean): string {
  const [head] = path;
  switch (head) {
    case "workDate":
      return "work_date";
    case "operationId":
      return "operation";
    case "fromStationFt":
      return stationsInFeet ? "station_from_ft" : "station_from";
    case "toStationFt":
      return stationsInFeet ? "station_to_ft" : "station_to";
    case "tempF":
      return "temp_f";
    case "lostHours":
      return "lost_hours";
    case "lostReason":
      return "lost_reason";
    case "discovered":
      return "discovered";
    default:
      return String(head ?? "(row)");
  }
}

/**
 * The shifts of `text` for `plan`, or the problems that stop them: `existing` = the shifts already in the log,
 * `today` = the date where the work is (no shift may be recorded after it).
 */
export function readFieldLogCsv(text: string, plan: Scenario, existing: ReadonlyArray<RuleEntry>, today: string): FieldLogImport {
  const table = readCsv(text, ["work_date", "shift"], COLUMNS);
  const problems = [...table.problems];
  const has = (c: string) => table.headers.includes(c);
  if (!has("operation") && !has("operation_name")) problems.push({ row: 1, field: "operation", message: 'the header has no "operation" or "operation_name" column' });
  const stationsInFeet = has("station_from_ft") && has("station_to_ft");
  if (!stationsInFeet && !(has("station_from") && has("station_to"))) {
    problems.push({ row: 1, field: "stations", message: 'the header needs "station_from_ft" and "station_to_ft" (feet) or "station_from" and "station_to" (1250 or 12+50)' });
  }
  if (problems.some((p) => p.row === 1)) return { shifts: [], skippedDeleted: 0, problems };
  const rows = table.rows.filter((r) => (r.values.status ?? "").toLowerCase() !== "deleted");
  const skippedDeleted = table.rows.length - rows.length;
  if (rows.length > MAX_IMPORT_SHIFTS) {
    return { shifts: [], skippedDeleted, problems: [{ row: 1, field: "(file)", message: `the file holds ${rows.length.toLocaleString("en-US")} shifts; load at most ${MAX_IMPORT_SHIFTS.toLocaleString("en-US")} at a time` }] };
  }

  const shiftNames = plan.calendar.shifts.map((s) => s.name).join(", ");
  const find = <T extends { id: string; name: string }>(list: ReadonlyArray<T>, raw: string) => list.find((x) => x.id === raw) ?? list.find((x) => x.name.toLowerCase() === raw.toLowerCase());
  const shifts: ImportedShift[] = [];
  for (const { line, values: v } of rows) {
    const before = problems.length;
    const shift = find(plan.calendar.shifts, v.shift ?? "");
    if (!shift) problems.push({ row: line, field: "shift", message: `“${v.shift ?? ""}” is not a shift of this plan (${shiftNames})` });
    const opRaw = v.operation || v.operation_name || "";
    const op = find(plan.operations, opRaw);
    if (!op) problems.push({ row: line, field: v.operation ? "operation" : "operation_name", message: `“${opRaw}” is not an operation of this plan` });
    const rain = (v.rain ?? "").toLowerCase();
    if (!YES.has(rain) && !NO.has(rain)) problems.push({ row: line, field: "rain", message: `“${v.rain}” must be yes or no` });
    const discovered = (v.discovered ?? "")
      .split(";")
      .map((s) => s.trim())
      .filter(Boolean)
      .map((s) => {
        const m = CONDITION.exec(s);
        const kind = m && conditionKind(m[1]);
        if (!m || !kind) {
          problems.push({ row: line, field: "discovered", message: `“${s}” must read like “Bottom-mat exposure STA 1+00–STA 1+50 (12 ft²)” (or Full-depth repair)` });
          return null;
        }
        return { kind, fromStationFt: m[2], toStationFt: m[3], areaSqFt: Number(m[4].replace(/,/g, "")) };
      });
    if (problems.length > before) continue;
    const number = (raw: string | undefined, empty: number | null) => (raw === undefined || raw === "" ? empty : Number(raw));
    const parsed = progressEntrySchema.safeParse({
      workDate: v.work_date ?? "",
      shift: shift!.id,
      operationId: op!.id,
      fromStationFt: stationsInFeet ? v.station_from_ft : v.station_from,
      toStationFt: stationsInFeet ? v.station_to_ft : v.station_to,
      crew: v.crew ?? "",
      tempF: number(v.temp_f, null),
      rain: YES.has(rain),
      lostHours: number(v.lost_hours, 0),
      lostReason: v.lost_reason ?? "",
      discovered,
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) problems.push({ row: line, field: columnOf(issue.path, stationsInFeet), message: issue.message });
      continue;
    }
    shifts.push({ line, entry: parsed.data });
  }
  if (problems.length) return { shifts: [], skippedDeleted, problems };

  // The rules against the plan and every other shift, the file's own included: a stretch recorded twice (in the log
  // and the file, or twice in the file) is named on each of its rows, and a row may lean on a predecessor's shift
  // anywhere in the file, whatever the order of the rows.
  const id = (line: number) => `line ${line}`;
  const others: RuleEntry[] = [...existing, ...shifts.map((s) => ({ ...s.entry, id: id(s.line) }))];
  for (const s of shifts) {
    for (const p of checkProgressEntry({ scenario: plan, entry: s.entry, others, today, id: id(s.line) })) {
      problems.push({ row: s.line, field: columnOf(p.path.split(/[.[]/), stationsInFeet), message: p.message });
    }
  }
  return { shifts: problems.length ? [] : shifts, skippedDeleted, problems };
}

/** The first and last work date of some shifts (yyyy-mm-dd; null when there are none). */
export function workDateSpan(entries: ReadonlyArray<{ workDate: string }>): { from: string | null; to: string | null } {
  const dates = entries.map((e) => e.workDate).sort();
  return { from: dates[0] ?? null, to: dates.at(-1) ?? null };
}

/**
 * What a file's shifts come to, operation by operation in the plan's order — what the Field log shows after
 * "Check the file" and before anything is stored, so whoever loads a season of shifts sees that the file says what
 * they meant (each operation's shifts and feet, the dates, the rain and lost hours) before it is in the log.
 */
export function importSummary(read: Pick<FieldLogImport, "shifts" | "skippedDeleted">, plan: Scenario): ProgressImportPreview {
  const entries = read.shifts.map((s) => s.entry);
  // The Field log's own per-operation reading (progress to date), of the file's shifts alone: the feet are what a
  // re-forecast would count as done from them.
  const operations = progressToDate(plan, entries)
    .filter((o) => o.shifts > 0)
    .map((o) => ({ operationId: o.id, name: o.name, shifts: o.shifts, feet: o.doneFt, first: o.firstDate!, last: o.lastDate!, lostHours: o.lostHours }));
  return {
    shifts: entries.length,
    skippedDeleted: read.skippedDeleted,
    ...workDateSpan(entries),
    operations,
    rainShifts: entries.filter((e) => e.rain).length,
    discovered: entries.reduce((sum, e) => sum + e.discovered.length, 0),
  };
}
