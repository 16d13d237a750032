// The plain-language sentence of a run: target clause, unfinished iterations, convergence verdict.
import { describe, expect, it } from "vitest";
import type { RunSummary } from "@sim/summary";
import { BRIEF_MIN_ITERATIONS, iterationsStatement, p80Meaning, plainSummary, quantileText, STABLE_DAYS, winterCarryover } from "@/components/results/summary-text";
import type { Scenario } from "@sim/schema";

function summary(over: Partial<RunSummary> = {}): RunSummary {
  return {
    scenarioName: "t",
    seed: "s",
    iterations: 1000,
    unfinishedIterations: 0,
    startDate: "2027-04-05",
    finish: { p10: "2027-09-20", p50: "2027-10-03", p80: "2027-10-14", p90: "2027-10-20" },
    finishAt: { p10: "2027-09-20T12:00", p50: "2027-10-03T12:00", p80: "2027-10-14T12:00", p90: "2027-10-20T12:00" },
    operations: [],
    histogram: [],
    cdf: [],
    target: null,
    weatherLostShifts: { p50: 3, p80: 5 },
    discoveredHours: { p50: 0, p80: 0 },
    stages: [],
    laneClosedHours: { total: { p50: 0, p80: 0 }, byClosure: [], byDay: [] },
    winterStandingShare: 0,
    convergenceDays: 0.5,
    season1End: null,
    representative: { iteration: 0, finish: "2027-10-03T12:00", finishHours: 0, trace: { packets: [], pauses: [] }, closureTimeline: [] },
    ...over,
  };
}

describe("plainSummary", () => {
  it("P80 date and the target clause", () => {
    const p = plainSummary(summary({ target: { date: "2027-10-01", probability: 0.62 } }));
    expect(p.p80).toBe("14 Oct 2027");
    expect(p.targetClause).toBe(", 62 % chance of meeting the 1 Oct 2027 target");
    expect(p.percentiles).toBe("P50 3 Oct 2027 · P80 14 Oct 2027 · P90 20 Oct 2027");
  });

  it("no target: no clause; no season-1 sentence for a single season", () => {
    const p = plainSummary(summary());
    expect(p.targetClause).toBe("");
    expect(p.season1).toBeNull();
    expect(p.unfinished).toBeNull();
  });

  it("two-season plans name the season-1 end", () => {
    expect(plainSummary(summary({ season1End: { p50: "2027-11-20T16:00" } })).season1).toContain("20 Nov 2027");
  });

  it("convergence: stable at or under the tolerance, 'run more' above it, unknown when null", () => {
    expect(plainSummary(summary({ convergenceDays: 0.5 })).convergence).toEqual({ stable: true, text: "P80 moved 0.5 days between the two halves of the run — stable." });
    expect(plainSummary(summary({ convergenceDays: STABLE_DAYS })).convergence.stable).toBe(true);
    const more = plainSummary(summary({ convergenceDays: STABLE_DAYS + 0.1 })).convergence;
    expect(more.stable).toBe(false);
    expect(more.text).toMatch(/run more iterations/);
    expect(plainSummary(summary({ convergenceDays: null })).convergence.stable).toBeNull();
  });

  it("unfinished iterations are counted and never shown as a date", () => {
    const some = plainSummary(summary({ unfinishedIterations: 250, finish: { p10: "2027-09-20", p50: "2027-10-03", p80: "unfinished", p90: "unfinished" } }));
    expect(some.unfinished).toBe("250 of 1,000 iterations (25 %) did not finish within the six-year horizon; percentiles they reach are shown as not reached.");
    expect(some.p80).toBe(quantileText("unfinished"));
    expect(some.p80).not.toMatch(/\d/);
    const all = plainSummary(summary({ unfinishedIterations: 1000 }));
    expect(all.unfinished).toMatch(/^None of the 1,000 iterations finished/);
  });
});

describe("stages and lane-closed hours in words", () => {
  const q = (p50: string, p80: string) => ({ p10: p50, p50, p80, p90: p80 });
  it("one line per stage with its lanes and restoration; none for a one-stage plan", () => {
    const two = plainSummary(
      summary({
        stages: [
          { id: "a", name: "North lane", lanes: ["L1"], finish: q("2027-05-19", "2027-05-24") },
          { id: "b", name: "South lanes", lanes: ["L2", "L3"], finish: q("2027-08-04", "unfinished") },
        ],
      }),
    );
    expect(two.stages).toEqual([
      "Stage 1: North lane (L1): restored P50 19 May 2027 · P80 24 May 2027",
      "Stage 2: South lanes (L2, L3): restored P50 4 Aug 2027 · P80 not reached within the six-year horizon",
    ]);
    expect(plainSummary(summary({ stages: [{ id: "a", name: "Whole deck", lanes: ["L1"], finish: q("2027-05-19", "2027-05-24") }] })).stages).toEqual([]);
  });
  it("lane-closed hours rounded, P50 and P80; absent for runs stored before the closure timeline", () => {
    const p = plainSummary(summary({ laneClosedHours: { total: { p50: 4803.6, p80: 5120.2 }, byClosure: [], byDay: [] } }));
    expect(p.laneClosed).toMatch(/^Lane-closed hours: 4,804 P50 · 5,120 P80 /);
    expect(plainSummary(summary({ laneClosedHours: undefined as unknown as RunSummary["laneClosedHours"] })).laneClosed).toBeNull();
  });
});

describe("plain words for an executive", () => {
  it("says what P80 means in one sentence", () => {
    expect(p80Meaning(summary())).toBe("P80 means 8 in 10 of the 1,000 simulated outcomes (weather, production rates, deterioration found) finish by 14 Oct 2027; 1 in 5 finish later.");
  });

  it("a single-season plan says what share of iterations carries work over winter", () => {
    const plan = { startDate: "2027-04-05", calendar: { season: { plan: "single", winterStart: "11-15", winterEnd: "03-31" } } } as unknown as Scenario;
    // 72 % finished on 14 Nov (the last curve point before the 15 Nov stand-down): 28 % carry over.
    const s = summary({ cdf: [{ date: "2027-10-01", p: 0.4 }, { date: "2027-11-14", p: 0.72 }, { date: "2028-05-01", p: 1 }] });
    expect(winterCarryover(s, plan)).toBe("In 28 % of the iterations the work is not finished by the winter stand-down (15 Nov 2027) and carries over to the next season.");
    const two = { ...plan, calendar: { season: { ...plan.calendar.season, plan: "two" } } } as unknown as Scenario;
    expect(winterCarryover(s, two)).toBeNull();
  });
});

describe("iterationsStatement (the owner brief)", () => {
  it("always states the iteration count, and warns only when too few or not stable", () => {
    const ok = iterationsStatement(summary({ iterations: 5000, convergenceDays: 0.5 }));
    expect(ok.text).toBe("This forecast rests on 5,000 simulated outcomes (iterations).");
    expect(ok.warning).toBeNull();
    const few = iterationsStatement(summary({ iterations: BRIEF_MIN_ITERATIONS - 500, convergenceDays: 0.5 }));
    expect(few.text).toContain("500 simulated outcomes");
    expect(few.warning).toContain("500 iterations are fewer than the 1,000 a brief should rest on");
    const unsteady = iterationsStatement(summary({ iterations: 500, convergenceDays: STABLE_DAYS + 3 }));
    expect(unsteady.warning).toContain("fewer than the 1,000");
    expect(unsteady.warning).toContain(`not yet stable (the P80 moved ${STABLE_DAYS + 3} days`);
    expect(iterationsStatement(summary({ iterations: 5000, convergenceDays: null })).warning).toContain("could not be measured");
  });
});
