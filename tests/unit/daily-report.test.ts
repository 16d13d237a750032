/**
 * The daily report's day: which `?date=` is a real day, the days with shifts either side of it, and the day in sum
 * worked by hand.
 */
import { describe, expect, it } from "vitest";
import { daySum, neighbourDays, readDay, type DayShift } from "../../src/lib/daily-report";

describe("readDay", () => {
  it("takes a real calendar date and nothing else", () => {
    expect(readDay("2026-10-28")).toBe("2026-10-28");
    expect(readDay("2028-02-29")).toBe("2028-02-29"); // a leap day
    for (const bad of [undefined, "", "2026-02-30", "2027-02-29", "2026-13-01", "28/10/2026", "2026-10-28T00:00", "yesterday", "2026-1-5"]) expect(readDay(bad)).toBeNull();
  });
});

describe("neighbourDays", () => {
  const log = ["2026-10-20", "2026-10-26", "2026-10-26", "2026-10-28"].map((workDate) => ({ workDate }));
  it("finds the nearest days with shifts before and after, also from a day without any", () => {
    expect(neighbourDays(log, "2026-10-26")).toEqual({ before: "2026-10-20", after: "2026-10-28" });
    expect(neighbourDays(log, "2026-10-27")).toEqual({ before: "2026-10-26", after: "2026-10-28" });
    expect(neighbourDays(log, "2026-10-20")).toEqual({ before: null, after: "2026-10-26" });
    expect(neighbourDays(log, "2026-11-02")).toEqual({ before: "2026-10-28", after: null });
    expect(neighbourDays([], "2026-11-02")).toEqual({ before: null, after: null });
  });
});

describe("daySum", () => {
  const s = (over: Partial<DayShift>): DayShift => ({ workDate: "2026-10-26", operationId: "hydro", fromStationFt: 0, toStationFt: 0, tempF: null, rain: false, lostHours: 0, discovered: [], ...over });
  it("adds the day's feet per operation, temperatures, rain, hours lost and conditions", () => {
    const sum = daySum([
      s({ operationId: "hydro", fromStationFt: 4200, toStationFt: 4285, tempF: 64, lostHours: 1.5, discovered: [{ areaSqFt: 12 }, { areaSqFt: 30 }] }),
      s({ operationId: "hydro", fromStationFt: 4285, toStationFt: 4300, tempF: 58, rain: true }),
      s({ operationId: "cleanup", fromStationFt: 4100, toStationFt: 4200 }),
    ]);
    expect(sum).toEqual({
      shifts: 3, feetByOperation: new Map([["hydro", 100], ["cleanup", 100]]), lostHours: 1.5, rainShifts: 1, lowF: 58, highF: 64, conditions: 2, conditionAreaSqFt: 42,
    });
  });
  it("has no temperatures when none was recorded", () => {
    expect(daySum([s({})])).toMatchObject({ lowF: null, highF: null, rainShifts: 0 });
  });
});
