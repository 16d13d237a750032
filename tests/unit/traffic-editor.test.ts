// The plan editor's traffic section: problems in `traffic` and `costs` open the fifth section; the demo's
// traffic and costs survive the editor's normalization (defaults filled, nothing dropped).
import { describe, expect, it } from "vitest";
import { normalizeDefinition, sectionOf } from "@/components/plan-editor/plan-logic";
import { loadScenario } from "./engine-fixtures";

describe("traffic section of the plan editor", () => {
  it("routes traffic and cost problem paths to the traffic section", () => {
    expect(sectionOf("traffic.directions[0].demand.weekday[3]")).toBe("traffic");
    expect(sectionOf("definition.costs.valueOfTime.carPerVehHour")).toBe("traffic");
    expect(sectionOf("weather.monthly[2].tmaxMeanF")).toBe("weather");
  });

  it("keeps the demo's traffic profile and costs through normalization", () => {
    const demo = loadScenario("kestrel-two-season.json");
    const v = normalizeDefinition(demo);
    expect(v.traffic?.directions[0].demand.holidayPeak).toEqual(demo.traffic!.directions[0].demand.holidayPeak);
    expect(v.costs?.fieldCostPerDay).toBe(38000);
    // A plan without them stays without them.
    const plain = normalizeDefinition(loadScenario("small-deterministic.json"));
    expect("traffic" in plain || "costs" in plain).toBe(false);
  });
});
