/** Plans the weather never lets finish are named in words before a run (sim/feasibility.ts). */
import { describe, expect, it } from "vitest";
import { weatherFeasibility, workMonths } from "../../sim/feasibility";
import { parseScenario } from "../../sim/validate";
import type { Scenario } from "../../sim/schema";
import { loadScenario } from "./engine-fixtures";

const load = (file: string): Scenario => {
  const r = parseScenario(loadScenario(file));
  if (!r.ok) throw new Error(file);
  return r.scenario;
};

describe("weather feasibility", () => {
  it("the demo and the small deck can finish", () => {
    expect(weatherFeasibility(load("kestrel-two-season.json"))).toEqual([]);
    expect(weatherFeasibility(load("small-deterministic.json"))).toEqual([]);
  });

  it("Celsius temperatures entered as °F: placement can never reach 45 °F and rising, said in words", () => {
    const k = load("kestrel-two-season.json");
    // °C values of a temperate climate: the warmest month's maximum 31, sd 3 → 31 + 9 = 40 < 45.
    const monthly = k.weather.monthly.map((m, i) => ({ ...m, tmaxMeanF: 5 + 26 * Math.sin((Math.PI * i) / 11), tmaxSdF: 3, tminMeanF: -5 + 20 * Math.sin((Math.PI * i) / 11) }));
    const problems = weatherFeasibility({ ...k, weather: { ...k.weather, monthly } });
    const i = k.operations.findIndex((o) => o.id === "placement");
    expect(problems).toContainEqual({ path: `operations[${i}].gates.minTempF`, message: expect.stringMatching(/^LMC placement needs 45 °F and rising; no month of this climate outside winter reaches it \(the warmest, (June|July), averages a maximum of 31 °F\)/) });
  });

  it("only months with a day outside winter count", () => {
    const k = load("kestrel-two-season.json"); // winter 11-15 … 03-31
    expect(workMonths(k)).toEqual([3, 4, 5, 6, 7, 8, 9, 10]);
    // A warm December-to-March does not help when winter covers it.
    const monthly = k.weather.monthly.map((m, i) => ({ ...m, tmaxMeanF: [0, 1, 2, 11].includes(i) ? 80 : 30, tmaxSdF: 2 }));
    expect(weatherFeasibility({ ...k, weather: { ...k.weather, monthly } }).length).toBeGreaterThan(0);
  });

  it("rain every day fails a no-rain gate", () => {
    const k = load("kestrel-two-season.json");
    const monthly = k.weather.monthly.map((m) => ({ ...m, pWetAfterDry: 1, pWetAfterWet: 1 }));
    const problems = weatherFeasibility({ ...k, weather: { ...k.weather, monthly } });
    expect(problems.some((p) => p.path.endsWith("gates.noRain") && /rains every day/.test(p.message))).toBe(true);
  });
});
