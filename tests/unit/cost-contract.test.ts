/** Road-user and contract costs (sim/cost.ts): the formulas by hand and inside a run of the small deck. */
import { describe, expect, it } from "vitest";
import { contractCost, parseScenario, roadUserCost, runScenario } from "../../sim/index";
import { costsSchema } from "../../sim/schema";
import { small } from "./engine-fixtures";

const costs = costsSchema.parse({ fieldCostPerDay: 1000, mobilizationPerSeason: 500, winterProtectionPerWinter: 2000, incentivePerDay: 100, disincentivePerDay: 300 });

describe("costs", () => {
  it("road-user cost splits delay by the heavy-vehicle share", () => {
    // Source: FHWA-HOP-12-005 (delay cost = vehicle-hours × value of time by class): 1,000 veh-h with 10 %
    // trucks at $20 (car) and $40 (truck) per veh-h = 900 · 20 + 100 · 40 = $22,000.
    expect(roadUserCost(1000, 0.1, 20, 40)).toBeCloseTo(22000, 9);
  });

  it("contract cost: field days, mobilization per season, winter protection, incentive and disincentive", () => {
    // 40 days · $1,000 + 2 seasons · $500 + 1 winter · $2,000 = $43,000; 3 days early → + $300; 2 days late → − $600.
    expect(contractCost({ costs, workingDays: 40, seasons: 2, finishDay: 100, targetDay: null })).toBe(43000);
    expect(contractCost({ costs, workingDays: 40, seasons: 2, finishDay: 97, targetDay: 100 })).toBe(43300);
    expect(contractCost({ costs, workingDays: 40, seasons: 2, finishDay: 102, targetDay: 100 })).toBe(42400);
    expect(contractCost({ costs, workingDays: 40, seasons: 2, finishDay: Infinity, targetDay: 100 })).toBe(Infinity);
  });

  it("in a run of the small deck: 3 working days, one season, finished 2 days before the target", () => {
    // The small deck works Mon 5, Tue 6 and Wed 7 April 2027 (engine-handworked.test.ts) and finishes on Wed;
    // the target is Fri 9 April: 3 · $1,000 + $500 + 2 days early · $100 = $3,700.
    const r = parseScenario(small((s) => {
      s.targetDate = "2027-04-09";
      s.costs = { fieldCostPerDay: 1000, mobilizationPerSeason: 500, winterProtectionPerWinter: 2000, incentivePerDay: 100, disincentivePerDay: 300 };
    }));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const s = runScenario(r.scenario, { iterations: 2, seed: "c" });
    expect(s.cost!.contract).toEqual({ p50: 3700, p80: 3700, mean: 3700 });
    // No traffic section: no delay and no road-user cost, but the dollar year is still stated.
    expect(s.delay).toBeUndefined();
    expect(s.cost!.roadUser).toBeNull();
    expect(s.cost!.valueOfTimeYear).toBe(2015);
  });

  it("a night shift counts as one working day, for the day it starts", () => {
    // A 20:00 + 9 h night shift on weekdays with a closure 20:00–05:00; milling 1,000 ft at 50 ft/h = 20 h →
    // Mon 20–05, Tue 20–05, Wed 20–22: three shift days (Mon, Tue, Wed), though the work touches four dates.
    const r = parseScenario(small((s) => {
      s.calendar.shifts = [{ id: "night", name: "Night", startHour: 20, lengthHours: 9 }];
      s.calendar.closureWindows = [{ closure: "one-lane", dayTypes: ["weekday"], startHour: 20, endHour: 5 }];
      s.operations = [{ id: "milling", name: "Milling", kind: "crew", crews: 1, rate: { unit: "ftPerHour", dist: { type: "fixed", value: 50 } }, shifts: ["night"], closure: "one-lane" }];
      s.links = [];
      s.costs = { fieldCostPerDay: 1000 };
    }));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const s = runScenario(r.scenario, { iterations: 1, seed: "c" });
    expect(s.finishAt.p50).toBe("2027-04-07T22:00");
    expect(s.cost!.contract!.p50).toBe(3000);
  });
});
