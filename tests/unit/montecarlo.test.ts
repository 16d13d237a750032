import fc from "fast-check";
import { quantileRankSorted, quantileSorted } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { compileScenario, mergePartials, runIterations, summarizeRun } from "../../sim/index";
import { nearestRank } from "../../sim/percentiles";
import type { CrewOperation, Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { small } from "./engine-fixtures";

/** The small deck with random rates, discovered conditions and stochastic weather. */
function randomSmall(): Scenario {
  const r = parseScenario(
    small((s) => {
      (s.operations[0] as CrewOperation).rate.dist = { type: "triangular", min: 30, mode: 50, max: 60 };
      (s.operations[0] as CrewOperation).discovers = true;
      (s.operations[1] as CrewOperation).rate.dist = { type: "pert", min: 400, mode: 500, max: 700 };
      (s.operations[1] as CrewOperation).gates = { minTempF: 50, noRain: true, noRainHoursAfter: 2 };
      s.discovered = { defaultProbability: 0.3, extraHours: { type: "triangular", min: 1, mode: 2, max: 6 } };
      s.weather.mode = "stochastic";
      s.weather.monthly = s.weather.monthly.map((m) => ({ ...m, tmaxSdF: 6, tminSdF: 5, pWetAfterDry: 0.25, pWetAfterWet: 0.5 }));
      s.targetDate = "2027-04-09";
    }),
  );
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario as Scenario;
}

describe("Monte Carlo runs", () => {
  const scenario = randomSmall();
  const compiled = compileScenario(scenario);

  it("gives the same result split over any number of ranges", () => {
    const whole = runIterations(compiled, "split", 0, 60);
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: 59 }), { maxLength: 5 }), (cuts) => {
        const edges = [0, ...cuts.sort((a, b) => a - b), 60];
        const parts = edges.slice(1).map((to, i) => runIterations(compileScenario(scenario), "split", edges[i], to));
        const merged = mergePartials(parts.reverse());
        expect(merged).toEqual(whole);
        expect(summarizeRun(compiled, merged)).toEqual(summarizeRun(compiled, whole));
      }),
      { numRuns: 8, seed: 7 },
    );
  });

  it("varies with the seed and is stable for a seed", () => {
    const a = runIterations(compiled, "one", 0, 20);
    expect(runIterations(compiled, "one", 0, 20).finish).toEqual(a.finish);
    expect(runIterations(compiled, "two", 0, 20).finish).not.toEqual(a.finish);
  });

  it("stops early when asked and reports progress", () => {
    const seen: number[] = [];
    let calls = 0;
    const p = runIterations(compiled, "stop", 10, 30, (d) => seen.push(d), () => ++calls > 5);
    expect(p.to).toBe(15);
    expect(p.finish.length).toBe(5);
    expect(seen).toEqual([1, 2, 3, 4, 5]);
  });

  it("summarizes with nearest-rank percentiles, histogram, CDF, target probability and a representative", () => {
    const partial = runIterations(compiled, "sum", 0, 200);
    const s = summarizeRun(compiled, partial);
    expect(s.iterations).toBe(200);
    const sorted = Float64Array.from(partial.finish).sort();
    // Reference: simple-statistics quantileSorted (linear interpolation, R type 7, index (n − 1)p). For
    // n = 200 its index lies between ceil(p·n) − 1 and ceil(p·n), so it brackets the nearest-rank value.
    for (const p of [0.1, 0.5, 0.8, 0.9]) {
      const v = nearestRank(sorted, p);
      expect(v).toBe(sorted[Math.ceil(p * 200) - 1]);
      const ref = quantileSorted(Array.from(sorted), p);
      expect(ref).toBeGreaterThanOrEqual(v);
      expect(ref).toBeLessThanOrEqual(sorted[Math.ceil(p * 200)]);
    }
    const histTotal = s.histogram.reduce((a, b) => a + b.count, 0);
    expect(histTotal).toBe(200 - s.unfinishedIterations);
    expect(s.histogram.length).toBeLessThanOrEqual(60);
    expect(s.cdf.length).toBeLessThanOrEqual(200);
    expect(s.cdf[s.cdf.length - 1].p).toBe(1);
    const limit = 24 * 5; // end of 2027-04-09 (day 4)
    expect(s.target!.probability).toBe(Array.from(partial.finish).filter((f) => f <= limit).length / 200);
    const rep = s.representative;
    const gap = Math.abs(partial.finish[rep.iteration] - sorted[99]);
    expect(Array.from(partial.finish).every((f) => Math.abs(f - sorted[99]) >= gap)).toBe(true);
    expect(rep.finishHours).toBe(partial.finish[rep.iteration]);
    expect(rep.trace.packets.length).toBe(2 * compiled.packets);
    expect(JSON.parse(JSON.stringify(s))).toEqual(s);
    expect(s.laneClosedHours.byClosure.find((c) => c.closure === "one-lane")!.p50).toBeGreaterThan(0);
  });

  it("agrees with simple-statistics quantileRankSorted: the nearest rank is the first value whose rank reaches p", () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.double({ min: 0, max: 1e4, noNaN: true }), { minLength: 1, maxLength: 120 }), fc.constantFrom(0.1, 0.5, 0.8, 0.9), (xs, p) => {
        const sorted = Float64Array.from(xs).sort();
        const ref = Array.from(sorted);
        const v = nearestRank(sorted, p);
        const i = ref.indexOf(v);
        // Reference: simple-statistics quantileRankSorted (fraction of values ≤ x for distinct values).
        expect(quantileRankSorted(ref, v)).toBeGreaterThanOrEqual(p - 1e-12);
        if (i > 0) expect(quantileRankSorted(ref, ref[i - 1])).toBeLessThan(p);
      }),
      { numRuns: 300, seed: 3 },
    );
  });
});
