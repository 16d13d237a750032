/**
 * The demo and the engine against the trade's rules of thumb. These are common practice, no published
 * source (see SOURCES.md, "Latex-modified concrete overlays"); they are sanity checks on the
 * invented demo and on the engine's handling of the placement gate, not tuned values.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { compileScenario, drawSamples, parseScenario, simulate, type Scenario } from "../../sim/index";
import { hourlyTempF } from "../../sim/weather";
import type { CrewOperation } from "../../sim/schema";
import { templateScenario } from "../../src/lib/scenario-template";

const DEMOS = ["kestrel-two-season.json", "kestrel-single-season.json", "kestrel-holiday-work.json", "kestrel-two-placement-crews.json"];

function load(file: string): Scenario {
  const p = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${file}`, import.meta.url), "utf8")));
  if (!p.ok) throw new Error(JSON.stringify(p.problems));
  return p.scenario;
}
const placementOf = (s: Scenario) => s.operations.find((o) => o.id === "placement") as CrewOperation;

describe("placement: 45 °F and rising (common practice, no published source)", () => {
  it.each(DEMOS)("%s: the placement operation is gated at ≥ 45 °F and rising, and pours are continuous", (file) => {
    const p = placementOf(load(file));
    expect(p.gates.minTempF).toBeGreaterThanOrEqual(45);
    expect(p.gates.rising).toBe(true);
    expect(p.continuous).toBe(true);
  });

  it("the engine never starts a pour below 45 °F or while the air is cooling (stochastic weather, many seeds)", () => {
    const s = load("kestrel-two-season.json");
    const compiled = compileScenario(s);
    let pours = 0;
    for (let k = 0; k < 25; k++) {
      const samples = drawSamples(s, "trade", k);
      const r = simulate(compiled, samples, { trace: true });
      for (const t of r.trace!.packets) {
        if (t.op !== "placement") continue;
        pours++;
        const hourOfDay = t.start - 24 * Math.floor(t.start / 24);
        expect(hourOfDay).toBeGreaterThanOrEqual(6);
        expect(hourOfDay).toBeLessThan(15);
        expect(hourlyTempF(samples.weather, t.start)).toBeGreaterThanOrEqual(45 - 1e-9);
      }
    }
    expect(pours).toBeGreaterThan(25 * 50);
  });
});

describe("placement pace: about 20 ft in 5 minutes while the mixer trucks keep up (common practice, no published source)", () => {
  // 20 ft / 5 min = 240 lane-ft/h at best. The demo's rate is deck length per hour with every lane of the
  // packet placed lane by lane, so its best case in lane-feet is rate.max × lanes. A crew's average over a
  // pour (truck gaps, bulkheads, finishing) is below the best pace, so "on the order of" is taken as within
  // a factor of three of 240 lane-ft/h for the most optimistic rate.
  const BEST_LANE_FT_PER_HOUR = (20 / 5) * 60;

  it.each(DEMOS)("%s: the most optimistic placement rate is within a factor of 3 of 240 lane-ft/h", (file) => {
    const s = load(file);
    const p = placementOf(s);
    expect(p.rate.unit).toBe("ftPerHour");
    const dist = p.rate.dist;
    const max = dist.type === "fixed" ? dist.value : dist.type === "lognormal" ? dist.median * Math.exp(2 * dist.sigma) : dist.max;
    const laneFt = max * s.deck.lanes.length;
    expect(laneFt).toBeGreaterThan(BEST_LANE_FT_PER_HOUR / 3);
    expect(laneFt).toBeLessThan(BEST_LANE_FT_PER_HOUR * 3);
  });

  it("the template for new scenarios gates placement the same way", () => {
    const t = parseScenario(templateScenario("t", { deckLengthFt: 2000, startStationFt: 0, lanes: ["L1", "L2"] }, "2027-04-05"));
    if (!t.ok) throw new Error(JSON.stringify(t.problems));
    const p = placementOf(t.scenario);
    expect(p.gates.minTempF).toBeGreaterThanOrEqual(45);
    expect(p.gates.rising).toBe(true);
  });
});
