/**
 * The demo as a job in progress (scripts/demo-job.ts), with the seeding day pinned: the scenario dates move so
 * the first season has begun (in winter it is over and the second season is ahead), the field log runs to
 * yesterday and passes the app's rules, and the re-forecast dates lie in the past.
 */
import { describe, expect, it } from "vitest";
import { buildAsBuilt } from "../../sim/asbuilt";
import { compileScenario, simulate } from "../../sim/engine";
import { drawSamples } from "../../sim/samples";
import { parseIsoDate, weekdayOfDayNumber } from "../../sim/dates";
import { parseScenario } from "../../sim/validate";
import { demoDataDates, demoDayShift, demoFieldLog, shiftDates } from "../../scripts/demo-job";
import { progressEntrySchema } from "../../sim/progress-entry";
import { loadScenario } from "./engine-fixtures";

const raw = loadScenario("kestrel-two-season.json") as Record<string, any>;

function demoOn(today: string) {
  const parsed = parseScenario(shiftDates(raw, demoDayShift(raw.startDate, today)));
  if (!parsed.ok) throw new Error(parsed.problems.map((p) => p.message).join("; "));
  return parsed.scenario;
}

describe("demo dates from the seeding day", () => {
  it("in December the first season is over and the second lies ahead", () => {
    const plan = demoOn("2026-12-02");
    expect(plan.startDate).toBe("2026-04-06"); // the Monday on or after 5 April, like the file's 2027-04-05
    expect(plan.calendar.season.cutoffDate).toBe("2026-10-30");
    expect(plan.targetDate! > "2026-12-02").toBe(true);
  });

  it("in February the season is last year's; in June this year's is under way", () => {
    expect(demoOn("2027-02-10").startDate).toBe("2026-04-06");
    expect(demoOn("2027-06-15").startDate).toBe("2027-04-05");
    // On the start day itself the job has not begun, so the season before is taken.
    expect(demoOn("2027-04-05").startDate).toBe("2026-04-06");
  });

  it("keeps every weekday and leaves month-day fields alone", () => {
    const plan = demoOn("2026-12-02");
    for (const [a, b] of [
      [raw.startDate, plan.startDate],
      [raw.targetDate, plan.targetDate],
      [raw.calendar.season.cutoffDate, plan.calendar.season.cutoffDate],
    ]) {
      expect(weekdayOfDayNumber(parseIsoDate(b!))).toBe(weekdayOfDayNumber(parseIsoDate(a)));
    }
    expect(plan.calendar.season.winterStart).toBe(raw.calendar.season.winterStart);
  });
});

describe("the demo field log", () => {
  const today = "2026-12-02";
  const plan = demoOn(today);
  const log = demoFieldLog(plan, today);

  it("covers the first season up to yesterday with lost hours and discovered deterioration", () => {
    expect(log.every((e) => e.workDate < today && e.workDate >= plan.startDate)).toBe(true);
    const reached = (op: string) => Math.max(...log.filter((e) => e.operationId === op).map((e) => e.toStationFt));
    // The first season's work stops at the cut-off station (STA 72+00) and nothing beyond it is logged.
    expect(reached("setup")).toBe(plan.calendar.season.cutoffStationFt);
    expect(Math.max(...log.map((e) => e.toStationFt))).toBeLessThanOrEqual(plan.calendar.season.cutoffStationFt!);
    // Placement is well under way (its 09:30–15:00 day closures, set for traffic, make it the slower crew).
    expect(reached("placement")).toBeGreaterThan(plan.deck.startStationFt + 2000);
    expect(log.some((e) => e.lostHours > 0 && e.lostReason.length > 0)).toBe(true);
    expect(log.some((e) => e.discovered.length > 0 && e.operationId === "hydrodemolition")).toBe(true);
    // Lost hours never exceed a shift.
    expect(Math.max(...log.map((e) => e.lostHours))).toBeLessThanOrEqual(10);
  });

  it("every entry is an ordinary entry: the API's contract reads it back unchanged", () => {
    expect(log.length).toBeGreaterThan(50);
    for (const e of log) {
      const parsed = progressEntrySchema.safeParse(e);
      expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
      expect(parsed.data).toEqual(e);
    }
  });

  it("re-forecasting from its last data date schedules none of the recorded work again", () => {
    const dates = demoDataDates(plan, log, today);
    expect(dates.length).toBeGreaterThanOrEqual(3);
    expect(dates.every((d) => d < today)).toBe(true);
    expect([...dates].sort()).toEqual(dates);
    const st = buildAsBuilt(plan, log, dates[dates.length - 1]);
    expect(st.entriesUsed).toBe(log.length);
    expect(st.discovery.found).toBeGreaterThan(0);
    expect(st.discovery.found).toBeLessThanOrEqual(st.discovery.inspected);
    const c = compileScenario(plan, { asBuilt: st });
    const r = simulate(c, drawSamples(c.scenario, "demo", 0), { trace: true });
    for (const p of r.trace!.packets) if (p.crew >= 0) expect(p.start).toBeGreaterThanOrEqual(st.dataTime);
    const setup = st.ops.find((o) => o.id === "setup")!;
    expect(r.trace!.packets.some((p) => p.op === "setup" && setup.remaining[p.packet] === 0)).toBe(false);
  });

  it("a seeding day early in the season logs only the days before it", () => {
    const early = demoOn("2027-04-08");
    const few = demoFieldLog(early, "2027-04-08");
    expect(few.length).toBeGreaterThan(0);
    expect(few.every((e) => e.workDate <= "2027-04-07")).toBe(true);
    expect(demoDataDates(early, few, "2027-04-08")).toEqual(["2027-04-07"]);
  });
});
