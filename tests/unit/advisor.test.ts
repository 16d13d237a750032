/**
 * The closure-hours advisor (sim/advisor.ts) on a hand-worked demand profile, and against the engine's own
 * queue on a scenario that the advisor approves or refuses.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { closureHoursAdvice } from "../../sim/advisor";
import { compileScenario, parseScenario, runIterations, runScenario, summarizeRun, type Scenario } from "../../sim/index";
import { queueBreachCounter } from "../../sim/queue-breaches";
import type { QueueLimit } from "../../sim/queue-limit";

const MILE: QueueLimit = { unit: "miles", value: 1 };
const minutes = (value: number): QueueLimit => ({ unit: "minutes", value });

function scenarioWith(windows: { startHour: number; endHour: number }[], weekday: number[]): Scenario {
  const base = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
  const flat = Array<number>(24).fill(800);
  const input = {
    ...base,
    calendar: { ...base.calendar, closureWindows: windows.map((w) => ({ closure: "one-lane", dayTypes: ["weekday"], ...w })) },
    traffic: {
      method: "krammesLopez",
      basePcPerHourPerLane: 1600,
      openRoadPcPerHourPerLane: 2000,
      jamDensityPcPerMiPerLane: 200,
      directions: [{ id: "north", name: "Northbound", lanes: ["L1", "L2"], heavyVehicleShare: 0, demand: { weekday, friday: flat, saturday: flat, sunday: flat, holidayPeak: flat } }],
      closures: [{ closure: "one-lane", workIntensityPcPerHourPerLane: -100 }],
    },
  };
  const p = parseScenario(input);
  if (!p.ok) throw new Error(JSON.stringify(p.problems));
  return p.scenario;
}

// Hand-worked profile (veh/h by hour): 800 at night and in the evening, a morning peak 1,600 / 1,750 / 1,700 /
// 1,600 at 06–09, 1,200 at 10.
const WEEKDAY = [800, 800, 800, 800, 800, 800, 1600, 1750, 1700, 1600, 1200, ...Array<number>(13).fill(800)];

describe("closure-hours advisor, hand-worked", () => {
  // Capacity (Krammes & Lopez, no heavy vehicles, f_HV = 1): c = (1,600 + I) · f_HV · n = (1,600 − 100) · 1 · 1
  // = 1,500 veh/h with one of two lanes open. Queue length: 1 mile of two lanes at 200 pc/mi/ln stores
  // 400 vehicles, so the 1-mile limit is 400 veh; delay of the last vehicle = queue / 1,500 h.
  // D/D/1, the queue grows by (demand − 1,500) each hour and never goes below 0 (weekday follows weekday):
  // - start 06:00: +100 → 100, +250 → 350, +200 → 550 > 400 at 09:00: two hours may stand.
  // - start 07:00: +250 → 250, +200 → 450 > 400: one hour.
  // - start 08:00: +200 → 200, +100 → 300, −300 → 0 at 11:00, then 0 until the next morning: 06:00 +100, 07:00
  //   +250 → 350 ≤ 400 at 08:00 the next day — 24 hours later: 24 hours.
  // - start 09:00: 100, 0, …, next day 100, 350, then 08:00–09:00 +200 → 550: the 24th hour breaks it: 23 hours.
  // - start h = 10 … 23: no queue until 06:00 the next day; the hour 08:00–09:00 breaks it: (24 − h) + 8 hours,
  //   at most 24 — 10 → 22, 23 → 9.
  // - start h = 0 … 5: no queue until 06:00; 08:00–09:00 breaks it: 8 − h hours (0 → 8, 5 → 3).
  const expected = [8, 7, 6, 5, 4, 3, 2, 1, 24, 23, ...Array.from({ length: 14 }, (_, i) => 32 - (10 + i))];

  it("the longest closure from each start hour keeps the queue at or under one mile", () => {
    const advice = closureHoursAdvice(scenarioWith([{ startHour: 9, endHour: 15 }], WEEKDAY), MILE);
    const weekday = advice.find((a) => a.closure === "one-lane" && a.dayKind === "weekday")!;
    expect(weekday.hours[0].capacity).toBeCloseTo(1500, 9);
    expect(weekday.hours.map((h) => h.longestClosureFrom)).toEqual(expected);
  });

  it("a planned 09:00–15:00 window is approved: peak 100 veh = 0.25 mi, 4 minutes", () => {
    // 09:00 +100 → 100 veh; 10:00 −300 clears it. 100 / 400 = 0.25 mi; 100 / 1,500 h = 4 min.
    const weekday = closureHoursAdvice(scenarioWith([{ startHour: 9, endHour: 15 }], WEEKDAY), MILE).find((a) => a.dayKind === "weekday")!;
    expect(weekday.planned!.peakQueueVeh).toBeCloseTo(100, 9);
    expect(weekday.planned!.peakQueueMiles).toBeCloseTo(0.25, 9);
    expect(weekday.planned!.peakDelayMinutes).toBeCloseTo(4, 9);
    expect(weekday.planned!.breaks).toBe(false);
    expect(weekday.hours[9].plannedQueueMiles).toBeCloseTo(0.25, 9);
    expect(weekday.hours[16].plannedQueueMiles).toBe(0);
  });

  it("a planned 06:00–09:00 window is refused: peak 550 veh = 1.375 mi at 08:00–09:00, 22 minutes", () => {
    // 100, 350, 550 veh at 07:00, 08:00, 09:00; 550 / 400 = 1.375 mi; 550 / 1,500 h = 22 min.
    const weekday = closureHoursAdvice(scenarioWith([{ startHour: 6, endHour: 9 }], WEEKDAY), MILE).find((a) => a.dayKind === "weekday")!;
    expect(weekday.planned!.peakQueueMiles).toBeCloseTo(1.375, 9);
    expect(weekday.planned!.peakDelayMinutes).toBeCloseTo(22, 9);
    expect(weekday.planned!.peakHour).toBe(8);
    expect(weekday.planned!.breaks).toBe(true);
  });

  // A limit in minutes of delay. D/D/1: the last vehicle in a queue of Q vehicles served at μ veh/h waits
  // Q / μ h, since every vehicle ahead of it must be discharged first.
  // Source: D/D/1 queueing, Mannering & Washburn, Principles of Highway Engineering and Traffic Analysis,
  // queuing chapter — from memory. Here μ = 1,500 veh/h (the closure's capacity, above), so 12 minutes is
  // 0.2 h × 1,500 = 300 veh and 15 minutes is 375 veh.
  it("a limit of 12 minutes of delay = 300 veh at 1,500 veh/h: the longest closure from each morning hour", () => {
    // From 06:00: 100 veh (100 / 1,500 h = 4 min), then 350 veh (14 min > 12): one hour. From 07:00: 250 veh
    // = 10 min, then 450 = 18 min: one hour. From 08:00: 200 veh = 8 min, 300 veh = 12 min (not over), then it
    // clears; the next day 06:00 100, 07:00 350 = 14 min at the end of the 24th hour: 23 hours.
    const weekday = closureHoursAdvice(scenarioWith([{ startHour: 9, endHour: 15 }], WEEKDAY), minutes(12)).find((a) => a.dayKind === "weekday")!;
    expect(weekday.hours.slice(6, 9).map((h) => h.longestClosureFrom)).toEqual([1, 1, 23]);
  });

  it("against 15 minutes of delay (375 veh), 09:00–15:00 is approved (4 min) and 06:00–09:00 refused (22 min)", () => {
    // 09:00–15:00: peak 100 veh → 100 / 1,500 h × 60 = 4 min ≤ 15. 06:00–09:00: peak 550 veh → 550 / 1,500 h
    // × 60 = 22 min > 15. The same windows against a 25-minute limit (625 veh): both approved.
    const approved = closureHoursAdvice(scenarioWith([{ startHour: 9, endHour: 15 }], WEEKDAY), minutes(15)).find((a) => a.dayKind === "weekday")!;
    expect(approved.planned!.peakDelayMinutes).toBeCloseTo(4, 9);
    expect(approved.planned!.breaks).toBe(false);
    const refused = closureHoursAdvice(scenarioWith([{ startHour: 6, endHour: 9 }], WEEKDAY), minutes(15)).find((a) => a.dayKind === "weekday")!;
    expect(refused.planned!.peakDelayMinutes).toBeCloseTo(22, 9);
    expect(refused.planned!.breaks).toBe(true);
    // Hour by hour along the planned window: 100, 350, 550 veh at 07:00, 08:00, 09:00 → 4, 14, 22 min.
    expect(refused.hours.slice(6, 9).map((h) => h.plannedDelayMinutes)).toEqual([4, 14, 22].map((m) => expect.closeTo(m, 9)));
    const lenient = closureHoursAdvice(scenarioWith([{ startHour: 6, endHour: 9 }], WEEKDAY), minutes(25)).find((a) => a.dayKind === "weekday")!;
    expect(lenient.planned!.breaks).toBe(false);
  });

  it("without a limit given, the advisor holds the plan to its own traffic.queueLimit", () => {
    const s = scenarioWith([{ startHour: 6, endHour: 9 }], WEEKDAY);
    expect(s.traffic!.queueLimit).toEqual({ unit: "miles", value: 1 }); // the default: none was written
    const withMinutes = { ...s, traffic: { ...s.traffic!, queueLimit: minutes(25) } };
    expect(closureHoursAdvice(s).find((a) => a.dayKind === "weekday")!.planned!.breaks).toBe(true); // 1.375 mi > 1
    expect(closureHoursAdvice(withMinutes).find((a) => a.dayKind === "weekday")!.planned!.breaks).toBe(false); // 22 min ≤ 25
  });

  it("day kinds without a window of the closure carry no planned check; a weekday window meets holiday-peak demand on the getaway day", () => {
    const advice = closureHoursAdvice(scenarioWith([{ startHour: 9, endHour: 15 }], WEEKDAY));
    expect(advice.map((a) => a.dayKind)).toEqual(["weekday", "friday", "saturday", "sunday", "holidayPeak"]);
    expect(advice.filter((a) => a.planned).map((a) => a.dayKind)).toEqual(["weekday", "friday", "holidayPeak"]);
  });
});

describe("the advisor agrees with the engine's queue", () => {
  it("on full working days the engine's longest queue equals the advisor's planned peak", () => {
    // Fixed rates and weather: the crews use the whole 07:00–17:00 window on their full days, so the engine's
    // closure stands exactly the window the advisor checks. 07:00 +250 → 250, 08:00 +200 → 450,
    // 09:00 +100 → 550, 10:00 −300 → 250, 11:00 −700 → 0: peak 550 veh = 1.375 mi.
    const s = scenarioWith([{ startHour: 7, endHour: 17 }], WEEKDAY);
    const weekday = closureHoursAdvice(s).find((a) => a.dayKind === "weekday")!;
    expect(weekday.planned!.peakQueueVeh).toBeCloseTo(550, 9);
    const days = runScenario(s, { iterations: 1, seed: "a" }).traffic!.days;
    const peaks = days.map((d) => d.peakQueueVeh);
    expect(Math.max(...peaks)).toBe(550);
    for (const p of peaks) expect(p).toBeLessThanOrEqual(550);
  });
});

describe("days whose longest queue broke the limit (queueLimitBreaches)", () => {
  it("counts, per iteration, the days the engine's longest queue exceeds the limit", () => {
    // Fixed weather and rates: every iteration is the same; its working days peak at 550 veh = 1.375 mi
    // (above): over a 1-mile limit every working day with a full window counts, none over a 2-mile limit.
    const s = scenarioWith([{ startHour: 7, endHour: 17 }], WEEKDAY);
    const c = compileScenario(s);
    const one = queueBreachCounter(c, MILE);
    const two = queueBreachCounter(c, { unit: "miles", value: 2 });
    const summary = summarizeRun(c, runIterations(c, "b", 0, 3, undefined, undefined, (k, r) => (one.read(k, r), two.read(k, r))));
    const overOne = summary.traffic!.days.filter((d) => d.peakQueueMiles > 1).length;
    expect(overOne).toBeGreaterThan(0);
    expect(one.quantiles()).toEqual({ limit: MILE, p50: overOne, p80: overOne, anyShare: 1 });
    expect(two.quantiles()).toEqual({ limit: { unit: "miles", value: 2 }, p50: 0, p80: 0, anyShare: 0 });
  });

  it("a limit in minutes counts the days whose last queued vehicle waited longer (D/D/1: queue / discharge rate)", () => {
    // The full working days peak at 550 veh served at the closure's 1,500 veh/h: 550 / 1,500 h × 60 = 22 min
    // for the last vehicle in the queue (D/D/1 queueing, Mannering & Washburn, Principles of Highway Engineering
    // and Traffic Analysis — from memory). Over 20 minutes: the same days as over 1 mile (1.375 mi); over 25
    // minutes: none.
    const s = scenarioWith([{ startHour: 7, endHour: 17 }], WEEKDAY);
    const c = compileScenario(s);
    const twenty = queueBreachCounter(c, minutes(20));
    const twentyFive = queueBreachCounter(c, minutes(25));
    const summary = summarizeRun(c, runIterations(c, "b", 0, 3, undefined, undefined, (k, r) => (twenty.read(k, r), twentyFive.read(k, r))));
    const full = summary.traffic!.days.filter((d) => d.peakQueueVeh === 550);
    expect(full.length).toBeGreaterThan(0);
    for (const d of full) expect(d.peakDelayMinutes).toBeCloseTo(22, 1);
    const overTwenty = summary.traffic!.days.filter((d) => d.peakDelayMinutes! > 20).length;
    // 20 minutes at 1,500 veh/h is 500 veh: the days over it are those whose queue passed 500 vehicles.
    expect(overTwenty).toBe(summary.traffic!.days.filter((d) => d.peakQueueVeh > 500).length);
    expect(twenty.quantiles()).toEqual({ limit: minutes(20), p50: overTwenty, p80: overTwenty, anyShare: 1 });
    expect(twentyFive.quantiles()).toEqual({ limit: minutes(25), p50: 0, p80: 0, anyShare: 0 });
  });
});
