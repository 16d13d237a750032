/**
 * The public travel advisory (src/lib/advisory.ts) and the hour-by-hour queue it reads (sim/hourly-queue.ts):
 * both come from the stored run, and must agree with the run's own delay figures and closure timeline.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { formatDayNumber, parseIsoDate } from "../../sim/dates";
import { hourlyQueues } from "../../sim/hourly-queue";
import { parseScenario, runScenario } from "../../sim/index";
import { AVOID_MILES, buildAdvisory, nothingBeforeText } from "../../src/lib/advisory";
import { hoursSince } from "../../src/lib/exports/closures";
import { formatIsoDate } from "../../src/lib/format";

const load = (f: string) => {
  const p = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${f}`, import.meta.url), "utf8")));
  if (!p.ok) throw new Error(JSON.stringify(p.problems));
  return p.scenario;
};

describe("hour-by-hour queue from the stored closure timeline", () => {
  for (const file of ["kestrel-two-season.json", "kestrel-staged-three-lane.json"]) {
    it(`${file}: each day's longest hourly queue is the run's longest queue of that day`, () => {
      const s = load(file);
      const run = runScenario(s, { iterations: 8, seed: "adv" });
      const q = hourlyQueues(s, run.representative.closureTimeline)!;
      const day0 = parseIsoDate(s.startDate);
      const engine = new Map(run.traffic!.days.map((d) => [d.date, d.peakQueueMiles]));
      let compared = 0;
      q.miles.forEach((row, i) => {
        const date = formatDayNumber(day0 + q.firstDay + i);
        // The stored timeline is to the minute and the summary's miles to 0.01: a minute at a net inflow of
        // ~2,000 veh/h is ~33 veh ≈ 0.06 mi over three lanes at 190 pc/mi/ln is the worst case; 0.02 is ample here.
        expect(Math.max(...row)).toBeCloseTo(engine.get(date) ?? 0, 1);
        expect(Math.abs(Math.max(...row) - (engine.get(date) ?? 0))).toBeLessThan(0.02);
        if ((engine.get(date) ?? 0) > 0) compared++;
      });
      expect(compared).toBeGreaterThan(0);
    });
  }
});

/** "20:30" → 20.5, "24:00" → 24. */
const clockHours = (hhmm: string) => Number(hhmm.slice(0, 2)) + Number(hhmm.slice(3, 5)) / 60;

describe("the travel advisory", () => {
  const s = load("kestrel-two-season.json");
  const run = runScenario(s, { iterations: 8, seed: "adv" });
  const days = buildAdvisory(s, run, s.startDate, 400)!;
  const byDate = new Map(run.traffic!.days.map((d) => [d.date, d]));

  it("lists, day by day, exactly the closure time of the timeline cut at midnight", () => {
    const tl = run.representative.closureTimeline;
    for (const d of days.slice(0, 120)) {
      const dayStart = hoursSince(s.startDate, `${d.date}T00:00`);
      const expected = tl.reduce((sum, p) => sum + Math.max(0, Math.min(hoursSince(s.startDate, p.end), dayStart + 24) - Math.max(hoursSince(s.startDate, p.start), dayStart)), 0);
      const listed = d.closures.reduce((sum, c) => sum + clockHours(c.to) - clockHours(c.from), 0);
      expect(listed).toBeCloseTo(expected, 6);
    }
  });

  it("the expected longest backup is the run's longest queue of the day, and hours to avoid exist exactly when it passes a quarter mile", () => {
    for (const d of days) {
      const engine = byDate.get(d.date)?.peakQueueMiles ?? 0;
      expect(Math.abs(d.longestBackupMiles - engine)).toBeLessThanOrEqual(0.06);
      if (engine > AVOID_MILES + 0.02) expect(d.avoid.length).toBeGreaterThan(0);
      if (engine < AVOID_MILES - 0.02) expect(d.avoid).toEqual([]);
    }
  });

  it("the expected longest delay is the run's longest delay of the day, and days over the plan's limit are flagged in the limit's unit", () => {
    // The stored timeline is to the minute: a minute at a net inflow of ~2,000 veh/h is ~33 veh, which at a
    // closure capacity near 1,400 veh/h is ~1.4 min of delay for the last vehicle (queue / discharge rate).
    let compared = 0;
    for (const d of days) {
      const engine = byDate.get(d.date)?.peakDelayMinutes ?? 0;
      expect(Math.abs(d.longestDelayMinutes - engine)).toBeLessThanOrEqual(2);
      if (engine > 0) compared++;
      // The demo's limit is the default 1 mile.
      const miles = byDate.get(d.date)?.peakQueueMiles ?? 0;
      if (miles > 1.06) expect(d.overLimit).toBe(true);
      if (miles < 0.94) expect(d.overLimit).toBe(false);
    }
    expect(compared).toBeGreaterThan(0);
    const inMinutes = { ...s, traffic: { ...s.traffic!, queueLimit: { unit: "minutes" as const, value: 20 } } };
    for (const d of buildAdvisory(inMinutes, run, s.startDate, 400)!) {
      const engine = byDate.get(d.date)?.peakDelayMinutes ?? 0;
      if (engine > 22) expect(d.overLimit).toBe(true);
      if (engine < 18) expect(d.overLimit).toBe(false);
    }
  });

  it("flags holiday weekends: Memorial Day 2027 (Mon 31 May) with its weekend and the Friday before", () => {
    // Source: 5 U.S.C. 6103 — Memorial Day is the last Monday in May (31 May 2027). MODEL.md "Traffic": the
    // holiday peak covers the block (with the adjacent weekend) and the day before it.
    const flagged = new Set(days.filter((d) => d.holidayWeekend).map((d) => d.date));
    const listed = new Set(days.map((d) => d.date));
    for (const date of ["2027-05-28", "2027-05-29", "2027-05-30", "2027-05-31"]) if (listed.has(date)) expect(flagged.has(date)).toBe(true);
    for (const date of ["2027-05-25", "2027-06-02"]) if (listed.has(date)) expect(flagged.has(date)).toBe(false);
    expect([...flagged].some((d) => d.startsWith("2027-05-"))).toBe(true);
  });

  it("says when nothing is closed before the first day listed (a winter shutdown), and nothing when the list starts today", () => {
    // The demo's first season ends in the autumn and its second opens in the spring: from a day in its winter the
    // first day listed is in the spring.
    const winterDay = "2026-12-15";
    const fromWinter = buildAdvisory(s, run, winterDay, 3)!;
    expect(fromWinter[0].date > winterDay).toBe(true);
    expect(nothingBeforeText(fromWinter, winterDay)).toBe(`Nothing is planned to be closed before ${fromWinter[0].weekday} ${formatIsoDate(fromWinter[0].date)}.`);
    expect(nothingBeforeText(fromWinter, fromWinter[0].date)).toBeNull();
    expect(nothingBeforeText([], winterDay)).toBeNull();
  });

  it("starts at today: nothing before it, and at most the days asked for", () => {
    const later = buildAdvisory(s, run, "2027-06-01", 5)!;
    expect(later.length).toBeLessThanOrEqual(5);
    for (const d of later) expect(d.date >= "2027-06-01").toBe(true);
  });
});
