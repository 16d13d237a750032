/** The holiday trade-off (sim/tradeoff.ts): same seeds, policy flipped. */
import { tradeoffSentence } from "../../src/components/results/tradeoff-panel";
import { tradeoffRows } from "../../src/components/results/tradeoff-table";
import { describe, expect, it } from "vitest";
import { holidayTradeoff, parseScenario, runScenario, withHolidayPolicy } from "../../sim/index";
import type { ScenarioInput } from "../../sim/schema";
import { loadScenario, small } from "./engine-fixtures";

const flat = (v: number) => new Array(24).fill(v);

/** The small deck started the Wednesday before Memorial Day 2027 (Mon 31 May), with 1,000 veh/h on every day. */
function overMemorialDay(): ScenarioInput {
  return small((s) => {
    s.startDate = "2027-05-26";
    s.traffic = {
      directions: [{ id: "east", name: "Eastbound", lanes: ["L1", "L2"], heavyVehicleShare: 0, demand: { weekday: flat(1000), friday: flat(1000), saturday: flat(1000), sunday: flat(1000), holidayPeak: flat(2000) } }],
    };
  });
}

function parsed(input: ScenarioInput) {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}

describe("holiday trade-off", () => {
  it("working through flips the policy and opens weekday windows on holidays", () => {
    const s = parsed(small());
    const w = withHolidayPolicy(s, "workThrough");
    expect(w.calendar.holidays.policy).toBe("workThrough");
    expect(w.calendar.closureWindows[0].dayTypes).toEqual(["weekday", "holiday"]);
    expect(s.calendar.closureWindows[0].dayTypes).toEqual(["weekday"]); // the input is not changed
    expect(withHolidayPolicy(s, "standDown").calendar.closureWindows[0].dayTypes).toEqual(["weekday"]);
  });

  it("hand-worked over Memorial Day: one day gained, for the delay of one holiday closure", () => {
    // The deck needs 22 h of closure (engine-handworked.test.ts). From Wed 26 May: Wed and Thu 07:00–17:00, then
    // Fri 07:00–09:00 — done before the stand-down starts (Fri 28, 15:00), so the policy changes nothing.
    const t0 = holidayTradeoff(parsed(overMemorialDay()), "h", 2);
    expect(t0.daysGained).toEqual({ p50: 0, p80: 0 });
    expect(t0.extraDelayVehHours).toEqual({ p50: 0, p80: 0 });
    // Start a day later (Thu 27): Thu and Fri 07:00–15:00 (stand-down from 15:00 Fri) = 18 h, 4 h left.
    // Stand down: Tue 1 June 07:00–11:00 → finish Tue 1 June. Work through: Fri 15:00–17:00, then the
    // holiday Mon 31 May 07:00–09:00 → finish Mon 31 May: one day gained.
    // Delay: holiday-peak demand 2,000 veh/h on Fri 28 (getaway day) and Mon 31 vs 1,600 veh/h in one lane.
    // Stand down: Thu 27 (1,000 veh/h) nothing; Fri 07:00–15:00 +400 veh/h → 3,200 veh, drains at 2,000 veh/h
    // (4,000 − 2,000) in 1.6 h: ½·3,200·9.6 = 15,360 veh-h; Tue 1 June (1,000 veh/h) nothing → 15,360.
    // Work through: Fri 07:00–17:00 → 4,000 veh, ½·4,000·12 = 24,000; Mon 07:00–09:00 → 800 veh, ½·800·2.4 = 960
    // → 24,960. Extra delay 9,600 veh-h; × $21.15 (default car value of time) = $203,040.
    const later = overMemorialDay();
    later.startDate = "2027-05-27";
    const t = holidayTradeoff(parsed(later), "h", 2);
    expect(t.standDown.finish.p50).toBe("2027-06-01");
    expect(t.workThrough.finish.p50).toBe("2027-05-31");
    expect(t.daysGained).toEqual({ p50: 1, p80: 1 });
    expect(t.standDown.delayVehHours.p50).toBe(15360);
    expect(t.workThrough.delayVehHours.p50).toBe(24960);
    expect(t.extraDelayVehHours.p50).toBe(9600);
    expect(t.extraRoadUserCost.p50).toBe(203040);
    expect(t.hasTraffic).toBe(true);
  });

  it("uses the same seeds as a plain run of each policy", () => {
    const demo = parsed(loadScenario("kestrel-two-season.json"));
    const t = holidayTradeoff(demo, "same", 12);
    const stand = runScenario(withHolidayPolicy(demo, "standDown"), { iterations: 12, seed: "same" });
    const work = runScenario(withHolidayPolicy(demo, "workThrough"), { iterations: 12, seed: "same" });
    expect(t.standDown.finish).toEqual({ p50: stand.finish.p50, p80: stand.finish.p80 });
    expect(t.workThrough.finish).toEqual({ p50: work.finish.p50, p80: work.finish.p80 });
    expect(t.standDown.delayVehHours).toEqual({ p50: stand.delay!.vehicleHours.p50, p80: stand.delay!.vehicleHours.p80 });
    expect(t.workThrough.roadUserCost).toEqual({ p50: work.cost!.roadUser!.p50, p80: work.cost!.roadUser!.p80 });
    // The chance of meeting the target and the contract cost are those of the same plain runs.
    expect(t.standDown.targetProbability).toBe(stand.target!.probability);
    expect(t.workThrough.targetProbability).toBe(work.target!.probability);
    expect(t.targetProbabilityChange).toBeCloseTo(work.target!.probability - stand.target!.probability, 6);
    expect(t.workThrough.contractCost.p50).toBe(Math.round(work.cost!.contract!.p50!));
    expect(t.extraContractCost.p50).toBe(Math.round(work.cost!.contract!.p50!) - Math.round(stand.cost!.contract!.p50!));
  });

  it("says the change in the chance of meeting the target and in contract cost in words", () => {
    const demo = parsed(loadScenario("kestrel-two-season.json"));
    const t = holidayTradeoff(demo, "same", 12);
    const text = tradeoffSentence({ ...t, standDown: { ...t.standDown, targetProbability: 0.48 }, workThrough: { ...t.workThrough, targetProbability: 0.61 }, extraContractCost: { p50: 41000, p80: 45000 } });
    expect(text).toContain("The chance of meeting the 30 Jun 2028 target rises from 48 % to 61 %.");
    expect(text).toContain("The contract costs $41,000 more at P50.");
  });

  it("the results table says it all in one place, the longest holiday backup among it", () => {
    const demo = parsed(loadScenario("kestrel-two-season.json"));
    const t = holidayTradeoff(demo, "same", 12);
    const stand = runScenario(withHolidayPolicy(demo, "standDown"), { iterations: 12, seed: "same" });
    const rows = tradeoffRows(t);
    expect(rows.map((r) => r.label)).toEqual([
      "Finish (P50 / P80)",
      "Chance of meeting the target",
      "Delay to drivers, vehicle-hours (P50 / P80)",
      "Longest holiday backup (P50 / P80)",
      "Road-user cost (P50 / P80)",
      "Contract cost (P50 / P80)",
    ]);
    expect(rows[1].standDown).toBe(`${(stand.target!.probability * 100).toFixed(0)} %`);
    expect(rows[0].change).toBe(`${t.daysGained.p50} / ${t.daysGained.p80} days sooner`);
  });

  it("the longest holiday backup is the longest queue on a holiday-peak day, iteration by iteration", () => {
    // One iteration: its longest holiday-peak queue is at least the longest queue of Memorial Day 2027's peak
    // days (Mon 31 May; the peak days are Fri 28 – Mon 31) and at most the longest of any day.
    const demo = parsed(loadScenario("kestrel-two-season.json"));
    const t = holidayTradeoff(demo, "hol", 1);
    const stand = runScenario(withHolidayPolicy(demo, "standDown"), { iterations: 1, seed: "hol" });
    const memorial = stand.traffic!.days.filter((d) => d.date >= "2027-05-28" && d.date <= "2027-05-31").map((d) => d.peakQueueMiles);
    expect(t.standDown.holidayBackupMiles!.p50).toBeGreaterThanOrEqual(Math.max(0, ...memorial) - 0.01);
    const allDays = Math.max(...stand.traffic!.days.map((d) => d.peakQueueMiles));
    expect(t.standDown.holidayBackupMiles!.p50).toBeLessThanOrEqual(allDays + 0.01);
  });
});
