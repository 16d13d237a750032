/**
 * The field log as CSV: one row per shift with names beside ids, stations in feet and as stations, the length
 * worked, the shift's conditions in one cell, and formula-like text a person typed (a crew, a reason) reaching the
 * spreadsheet as text. Read back with papaparse.
 */
import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { DELETED_COLUMNS, FIELD_LOG_COLUMNS, fieldLogCsv, type FieldLogRow } from "../../src/lib/exports/field-log-csv";

const names = { operations: { milling: "Mechanical milling" }, shifts: { night: "Night shift" } };
const shift = (over: Partial<FieldLogRow> = {}): FieldLogRow => ({
  workDate: "2026-06-03", shift: "night", operationId: "milling", fromStationFt: 1250, toStationFt: 1600, crew: "M1",
  tempF: 61, rain: false, lostHours: 0, lostReason: "", discovered: [], enteredByName: "Rosa Tenney",
  createdAt: new Date("2026-06-04T06:10:00Z"), updatedAt: new Date("2026-06-04T07:00:00Z"), version: 2, ...over,
});
const read = (csv: string) => Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });

describe("fieldLogCsv", () => {
  it("writes one row per shift under the documented columns, names beside ids", () => {
    const parsed = read(fieldLogCsv([shift(), shift({ workDate: "2026-06-04", fromStationFt: 1600, toStationFt: 1900, tempF: null, rain: true, lostHours: 2.5, lostReason: "rain 02:00–04:30" })], names));
    expect(parsed.meta.fields).toEqual(FIELD_LOG_COLUMNS);
    expect(parsed.data).toHaveLength(2);
    expect(parsed.data[0]).toMatchObject({
      work_date: "2026-06-03", shift: "Night shift", operation: "milling", operation_name: "Mechanical milling",
      station_from: "STA 12+50", station_to: "STA 16+00", station_from_ft: "1250", station_to_ft: "1600", length_ft: "350",
      crew: "M1", temp_f: "61", rain: "no", lost_hours: "0", lost_reason: "", discovered: "", recorded_by: "Rosa Tenney",
      recorded_at: "2026-06-04T06:10:00.000Z", last_changed_at: "2026-06-04T07:00:00.000Z", version: "2",
    });
    expect(parsed.data[1]).toMatchObject({ temp_f: "", rain: "yes", lost_hours: "2.5", lost_reason: "rain 02:00–04:30" });
  });

  it("puts the shift's discovered conditions in one cell, in words", () => {
    const [row] = read(fieldLogCsv([shift({ discovered: [{ kind: "bottom-mat", fromStationFt: 1300, toStationFt: 1350, areaSqFt: 12 }, { kind: "full-depth", fromStationFt: 1500, toStationFt: 1520, areaSqFt: 4 }] })], names)).data;
    expect(row.discovered).toBe("Bottom-mat exposure STA 13+00–STA 13+50 (12 ft²); Full-depth repair STA 15+00–STA 15+20 (4 ft²)");
  });

  it("falls back to the id for an operation or shift the plan no longer has", () => {
    const [row] = read(fieldLogCsv([shift({ operationId: "retired-op", shift: "swing" })], names)).data;
    expect(row).toMatchObject({ operation: "retired-op", operation_name: "retired-op", shift: "swing" });
  });

  it("hands a spreadsheet typed text that looks like a formula as text", () => {
    const [row] = read(fieldLogCsv([shift({ crew: '=HYPERLINK("http://evil.example","x")', lostReason: "@SUM(A1)" })], names)).data;
    expect(row.crew).toBe(`'=HYPERLINK("http://evil.example","x")`);
    expect(row.lost_reason).toBe("'@SUM(A1)");
  });

  it("with deleted shifts: every shift ever entered, in the order worked then entered, each marked recorded or deleted", () => {
    const kept = [shift({ workDate: "2026-06-03", createdAt: new Date("2026-06-04T06:10:00Z") }), shift({ workDate: "2026-06-05", fromStationFt: 1600, toStationFt: 1900 })];
    const gone = [
      { ...shift({ workDate: "2026-06-04", crew: "M2" }), deletedByName: "Dana Whitcomb", deletedAt: new Date("2026-06-06T14:00:00Z") },
      { ...shift({ workDate: "2026-06-03", crew: "M9", createdAt: new Date("2026-06-04T05:00:00Z") }), deletedByName: null, deletedAt: new Date("2026-06-05T09:00:00Z") },
    ];
    const parsed = read(fieldLogCsv(kept, names, { deleted: gone }));
    expect(parsed.meta.fields).toEqual([...FIELD_LOG_COLUMNS, ...DELETED_COLUMNS]);
    expect(parsed.data.map((r) => [r.work_date, r.crew, r.status, r.deleted_by, r.deleted_at])).toEqual([
      ["2026-06-03", "M9", "deleted", "", "2026-06-05T09:00:00.000Z"],
      ["2026-06-03", "M1", "recorded", "", ""],
      ["2026-06-04", "M2", "deleted", "Dana Whitcomb", "2026-06-06T14:00:00.000Z"],
      ["2026-06-05", "M1", "recorded", "", ""],
    ]);
    // Without them, the plain export: the log as it stands, its columns unchanged.
    expect(read(fieldLogCsv(kept, names)).meta.fields).toEqual(FIELD_LOG_COLUMNS);
  });
});
