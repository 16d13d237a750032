// Loading a field log from a CSV file: the field log's own download loads back as it was (round trip, by hand and
// as a fast-check property), and every row is held to the same rules as a shift recorded by hand, each problem named
// by its line in the file and its column, with nothing loaded when any row has one.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { importSummary, readFieldLogCsv, MAX_IMPORT_SHIFTS } from "@/lib/csv/field-log-import";
import { fieldLogCsv, type FieldLogRow } from "@/lib/exports/field-log-csv";
import { parseScenario } from "@sim/validate";
import type { ProgressEntry } from "@sim/progress-entry";

const parsed = parseScenario(JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8")));
if (!parsed.ok) throw new Error("the fixture plan must parse");
const plan = parsed.scenario; // 1,000 ft from STA 0+00; milling, then overlay; one "day" shift; starts 2027-04-05
const TODAY = "2027-06-30";
const names = { operations: { milling: "Mechanical milling", overlay: "Overlay placement" }, shifts: { day: "Day shift" } };

const shift = (over: Partial<ProgressEntry>): ProgressEntry => ({
  workDate: "2027-04-06", shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 200,
  crew: "", tempF: null, rain: false, lostHours: 0, lostReason: "", discovered: [], ...over,
});
const asRow = (e: ProgressEntry, i: number): FieldLogRow => ({ ...e, enteredByName: "Rosa Tenney", createdAt: `2027-04-0${6 + (i % 3)}T20:00:00.000Z`, updatedAt: "2027-04-09T08:00:00.000Z", version: 1 });
const download = (entries: ProgressEntry[]) => fieldLogCsv(entries.map(asRow), names);

describe("a field log loaded from a CSV file", () => {
  it("takes back the field log's own download, shift for shift — conditions found, weather and lost hours included", () => {
    const log = [
      shift({ crew: "M1", tempF: 58, discovered: [{ kind: "bottom-mat", fromStationFt: 50, toStationFt: 75.5, areaSqFt: 12 }] }),
      shift({ workDate: "2027-04-07", fromStationFt: 200, toStationFt: 450, rain: true, lostHours: 2.5, lostReason: "Rain, 07:00–09:30", discovered: [{ kind: "full-depth", fromStationFt: 300, toStationFt: 320, areaSqFt: 40 }, { kind: "bottom-mat", fromStationFt: 400, toStationFt: 410, areaSqFt: 8 }] }),
      shift({ workDate: "2027-04-08", operationId: "overlay", fromStationFt: 0, toStationFt: 150, crew: "P1, P2", tempF: 61 }),
    ];
    const read = readFieldLogCsv(download(log), plan, [], TODAY);
    expect(read.problems).toEqual([]);
    expect(read.shifts.map((s) => s.entry)).toEqual(log);
    expect(read.shifts.map((s) => s.line)).toEqual([2, 3, 4]);
  });

  it("round-trips any log of milling stretches the rules accept (property)", () => {
    // Cut the deck at sorted points into stretches, each worked on its own day with arbitrary weather and lost hours.
    const log = fc.uniqueArray(fc.integer({ min: 1, max: 999 }), { minLength: 1, maxLength: 12 }).chain((cuts) => {
      const points = [0, ...cuts.sort((a, b) => a - b), 1000];
      return fc.tuple(...points.slice(1).map((to, i) =>
        fc.record({ tempF: fc.option(fc.integer({ min: -40, max: 130 }), { nil: null }), rain: fc.boolean(), lostHours: fc.constantFrom(0, 0.5, 3), crew: fc.constantFrom("", "M1", "Crew, with a comma", '"Quoted" crew') })
          .map((w) => shift({ workDate: `2027-04-${String(6 + i).padStart(2, "0")}`, fromStationFt: points[i], toStationFt: to, ...w, lostReason: w.lostHours > 0 ? "Rain" : "" })),
      ));
    });
    fc.assert(fc.property(log, (entries) => {
      const read = readFieldLogCsv(download(entries), plan, [], TODAY);
      expect(read.problems).toEqual([]);
      expect(read.shifts.map((s) => s.entry)).toEqual(entries);
    }), { numRuns: 200 });
  });

  it("reads a site spreadsheet's own columns: shift and operation by name, stations as 12+50, rain as yes/no, blanks as none", () => {
    const text = ["Work date,Shift,Operation name,Station from,Station to,Rain,Temp F", "2027-04-06,day shift,mechanical milling,0+00,2+50,Y,", "2027-04-07,Day shift,Overlay placement,STA 0+00,1+00,no,55"].join("\n");
    const read = readFieldLogCsv(text, plan, [], TODAY);
    expect(read.problems).toEqual([]);
    expect(read.shifts.map((s) => s.entry)).toEqual([
      shift({ toStationFt: 250, rain: true }),
      shift({ workDate: "2027-04-07", operationId: "overlay", toStationFt: 100, tempF: 55 }),
    ]);
  });

  it("skips the rows the audit download marks deleted", () => {
    const text = ["work_date,shift,operation,station_from_ft,station_to_ft,status", "2027-04-06,day,milling,0,200,recorded", "2027-04-06,day,milling,0,200,deleted"].join("\n");
    const read = readFieldLogCsv(text, plan, [], TODAY);
    expect(read.problems).toEqual([]);
    expect(read.shifts).toHaveLength(1);
    expect(read.skippedDeleted).toBe(1);
  });

  it("accepts a successor's row before its predecessor's: the file's rows are checked as one log, in any order", () => {
    const text = ["work_date,shift,operation,station_from_ft,station_to_ft", "2027-04-07,day,overlay,0,100", "2027-04-06,day,milling,0,200"].join("\n");
    expect(readFieldLogCsv(text, plan, [], TODAY).problems).toEqual([]);
  });

  it("names each bad row by its line and column, and loads nothing when any row has a problem", () => {
    const text = [
      "work_date,shift,operation,station_from_ft,station_to_ft,rain,lost_hours,lost_reason,discovered",
      "2027-04-06,day,milling,0,200,no,0,,", // fine on its own
      "2027-04-06,night,milling,200,300,no,0,,",
      "2027-04-07,day,grinding,200,300,no,0,,",
      "2027-04-07,day,milling,300,250,no,0,,",
      "2027-04-07,day,milling,300,400,maybe,0,,",
      "2027-04-08,day,milling,400,500,no,2,,",
      "2027-04-09,day,milling,500,600,no,0,,a crack somewhere",
      "2028-01-10,day,milling,600,700,no,0,,",
      "2027-04-10,day,overlay,0,300,no,0,,",
      "2027-04-11,day,milling,150,250,no,0,,",
    ].join("\n");
    const read = readFieldLogCsv(text, plan, [], TODAY);
    expect(read.shifts).toEqual([]);
    const byLine = new Map<number, string[]>();
    for (const p of read.problems) byLine.set(p.row, [...(byLine.get(p.row) ?? []), `${p.field}: ${p.message}`]);
    expect(byLine.get(2)).toBeUndefined();
    expect(byLine.get(3)).toEqual(["shift: “night” is not a shift of this plan (Day shift)"]);
    expect(byLine.get(4)).toEqual(["operation: “grinding” is not an operation of this plan"]);
    expect(byLine.get(5)).toEqual(["station_to_ft: To station must be after the from station"]);
    expect(byLine.get(6)).toEqual(["rain: “maybe” must be yes or no"]);
    expect(byLine.get(7)).toEqual(["lost_reason: Reason for lost hours must be given when hours were lost"]);
    expect(byLine.get(8)?.[0]).toMatch(/^discovered: “a crack somewhere” must read like/);
  });

  it("holds the rows to the log's rules against the shifts already recorded and each other", () => {
    const existing = [{ id: "kept", workDate: "2027-04-06", shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 200 }];
    const text = [
      "work_date,shift,operation,station_from_ft,station_to_ft",
      "2027-04-07,day,milling,150,300", // overlaps the log
      "2027-04-08,day,milling,400,500",
      "2027-04-09,day,milling,450,550", // overlaps line 3
      "2027-07-01,day,milling,600,700", // after today
      "2027-04-10,day,overlay,0,600", // ahead of milling (nothing milled at 300–400 by then)
    ].join("\n");
    const read = readFieldLogCsv(text, plan, existing, TODAY);
    const at = (line: number) => read.problems.filter((p) => p.row === line).map((p) => `${p.field}: ${p.message}`);
    expect(at(2)).toEqual(["station_from_ft: Mechanical milling is already recorded over STA 0+00–STA 2+00 (2027-04-06, day shift): record only the stretch not yet done, or edit that entry"]);
    expect(at(3)[0]).toMatch(/^station_from_ft: Mechanical milling is already recorded over STA 4\+50–STA 5\+50 \(2027-04-09/);
    expect(at(4)[0]).toMatch(/^station_from_ft: Mechanical milling is already recorded over STA 4\+00–STA 5\+00 \(2027-04-08/);
    expect(at(5)).toEqual(["work_date: Work date must not be in the future (today is 2027-06-30)"]);
    expect(at(6)[0]).toMatch(/^station_(from|to)_ft: Overlay placement cannot be recorded ahead of Mechanical milling/);
    expect(read.shifts).toEqual([]);
  });

  it("refuses a file without the columns it needs, or with more shifts than one load takes, saying which", () => {
    expect(readFieldLogCsv("work_date,shift,station_from_ft,station_to_ft\n2027-04-06,day,0,100", plan, [], TODAY).problems).toEqual([
      { row: 1, field: "operation", message: 'the header has no "operation" or "operation_name" column' },
    ]);
    expect(readFieldLogCsv("work_date,shift,operation,from,to\n2027-04-06,day,milling,0,100", plan, [], TODAY).problems[0]).toMatchObject({ row: 1, field: "stations" });
    const many = ["work_date,shift,operation,station_from_ft,station_to_ft", ...Array.from({ length: MAX_IMPORT_SHIFTS + 1 }, () => "2027-04-06,day,milling,0,1")].join("\n");
    expect(readFieldLogCsv(many, plan, [], TODAY).problems).toEqual([{ row: 1, field: "(file)", message: "the file holds 5,001 shifts; load at most 5,000 at a time" }]);
  });

  it("sums what a checked file would add, operation by operation in the plan's order, before anything is stored", () => {
    // Overlay rows first in the file: the summary follows the plan (milling, then overlay), not the file.
    const log = [
      shift({ workDate: "2027-04-09", operationId: "overlay", fromStationFt: 0, toStationFt: 150, rain: true, lostHours: 1.5, lostReason: "Rain" }),
      shift({ crew: "M1", discovered: [{ kind: "bottom-mat", fromStationFt: 50, toStationFt: 75, areaSqFt: 12 }] }),
      shift({ workDate: "2027-04-07", fromStationFt: 200, toStationFt: 450.5, lostHours: 2, lostReason: "Breakdown" }),
    ];
    const read = readFieldLogCsv(download(log), plan, [], TODAY);
    expect(read.problems).toEqual([]);
    expect(importSummary(read, plan)).toEqual({
      shifts: 3,
      skippedDeleted: 0,
      from: "2027-04-06",
      to: "2027-04-09",
      operations: [
        { operationId: "milling", name: "Mechanical milling", shifts: 2, feet: 450.5, first: "2027-04-06", last: "2027-04-07", lostHours: 2 },
        { operationId: "overlay", name: "Overlay placement", shifts: 1, feet: 150, first: "2027-04-09", last: "2027-04-09", lostHours: 1.5 },
      ],
      rainShifts: 1,
      discovered: 1,
    });
  });
});
