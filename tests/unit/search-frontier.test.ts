import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { dominates, nonDominated, objectivesOf, outcomeOf } from "../../sim/frontier";
import { applyVariant, buildVariants, fullGrid, latinHypercube, searchSpecSchema, specProblems, variantLabel, type SearchDimension } from "../../sim/search";
import { BROWSER_WORK_BUDGET, iterationsThatFit, runWork, SEARCH_WORK_BUDGET, searchBudgetProblem, SERVER_WORK_BUDGET, timeLimitSeconds } from "../../sim/budget";
import { parseScenario } from "../../sim/validate";
import type { ScenarioInput } from "../../sim/schema";

const demo = JSON.parse(readFileSync(new URL("../../scenarios/kestrel-two-season.json", import.meta.url), "utf8")) as ScenarioInput;

/** The definition of the frontier, checked pair by pair. */
function bruteForce(points: number[][]): boolean[] {
  return points.map((p, i) => !points.some((q, j) => j !== i && q.every((x, k) => x <= p[k]) && q.some((x, k) => x < p[k])));
}

describe("frontier", () => {
  it("is exactly the non-dominated set (brute-force comparison)", () => {
    const value = fc.oneof(fc.integer({ min: 0, max: 6 }), fc.constant(Infinity));
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3 }).chain((k) => fc.array(fc.array(value, { minLength: k, maxLength: k }), { maxLength: 40 })), (points) => {
        expect(nonDominated(points)).toEqual(bruteForce(points));
      }),
      { numRuns: 300 },
    );
  });

  it("keeps equal plans both (neither beats the other)", () => {
    expect(nonDominated([[1, 2], [1, 2], [2, 3]])).toEqual([true, true, false]);
    expect(dominates([1, 2], [1, 2])).toBe(false);
  });

  it("counts an unfinished P80 as later than any date", () => {
    const done = objectivesOf({ p80Finish: "2028-07-09", targetProbability: null, delayVehHours: 10, contractCost: null });
    const unfinished = objectivesOf({ p80Finish: "unfinished", targetProbability: null, delayVehHours: 10, contractCost: null });
    expect(dominates(done, unfinished)).toBe(true);
  });

  it("reads the outcome from a summary's headline figures", () => {
    const o = outcomeOf({ finish: { p80: "2028-07-09" }, target: { probability: 0.56 }, delay: { vehicleHours: { p50: 1200 } }, cost: { contract: { p50: 5e6 } } });
    expect(o).toEqual({ p80Finish: "2028-07-09", targetProbability: 0.56, delayVehHours: 1200, contractCost: 5e6 });
  });
});

describe("variants", () => {
  it("builds every combination of a small grid", () => {
    expect(fullGrid([2, 3])).toEqual([[0, 0], [0, 1], [0, 2], [1, 0], [1, 1], [1, 2]]);
    const plan = buildVariants({ dimensions: [{ kind: "holidayPolicy", values: ["standDown", "workThrough"] }, { kind: "crews", operation: "overlay", values: [1, 2, 3] }], maxVariants: 6, seed: "s" });
    expect(plan.method).toBe("grid");
    expect(plan.variants).toHaveLength(6);
  });

  it("samples a large grid with every level of every dimension used evenly", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 7 }), { minLength: 1, maxLength: 4 }), fc.integer({ min: 2, max: 60 }), fc.string(), (sizes, count, seed) => {
        const sample = latinHypercube(sizes, count, seed);
        expect(sample.length).toBeLessThanOrEqual(count);
        expect(new Set(sample.map((v) => v.join(","))).size).toBe(sample.length);
        for (const v of sample)
          v.forEach((level, d) => {
            expect(level).toBeGreaterThanOrEqual(0);
            expect(level).toBeLessThan(sizes[d]);
          });
        // Before duplicates are dropped each level gets count/n strata; afterwards every level a stratum can reach
        // is still present when count ≥ n (a dropped point's level appears in the point it duplicated).
        sizes.forEach((n, d) => {
          if (count >= n) expect(new Set(sample.map((v) => v[d])).size).toBe(n);
        });
      }),
    );
  });

  it("is reproducible for one seed", () => {
    expect(latinHypercube([5, 4, 3], 20, "x")).toEqual(latinHypercube([5, 4, 3], 20, "x"));
  });

  it("applies each kind of choice to a copy of the plan, and the result still parses", () => {
    const overlay = demo.operations.find((o) => o.kind === "crew" && o.id.includes("overlay")) ?? demo.operations.find((o) => o.kind === "crew")!;
    const dims: SearchDimension[] = [
      { kind: "crews", operation: overlay.id, values: [1, 2] },
      { kind: "holidayPolicy", values: ["standDown", "workThrough"] },
      { kind: "startDate", values: [demo.startDate, "2027-05-03"] },
      { kind: "season", values: [{ plan: "single" }] },
    ];
    const v = applyVariant(demo, dims, [1, 1, 1, 0]);
    expect(v.operations.find((o) => o.id === overlay.id)).toMatchObject({ crews: 2 });
    expect(v.calendar.holidays.policy).toBe("workThrough");
    expect(v.startDate).toBe("2027-05-03");
    expect(v.calendar.season.plan).toBe("single");
    expect(v.calendar.season.cutoffDate).toBeUndefined();
    expect(demo.calendar.holidays.policy).not.toBe("workThrough"); // the base is untouched
    expect(parseScenario(v).ok).toBe(true);
    expect(variantLabel(dims, [1, 1, 1, 0])).toContain("2 crews");
  });

  it("keeps only the allowed closure windows", () => {
    const v = applyVariant(demo, [{ kind: "closureWindows", values: [[0]] }], [0]);
    expect(v.calendar.closureWindows).toEqual([demo.calendar.closureWindows[0]]);
  });

  it("a search from the field log cannot vary the start date (the work has started), and says so by path", () => {
    const dims: SearchDimension[] = [{ kind: "crews", operation: "placement", values: [1, 2] }, { kind: "startDate", values: ["2027-04-05", "2027-04-19"] }];
    const fromLog = { dataDate: "2027-06-01" };
    expect(specProblems(demo, { dimensions: dims, fromFieldLog: fromLog })).toEqual([{ path: "spec.dimensions[1]", message: "start dates cannot vary in a search from the field log: the work has started" }]);
    expect(specProblems(demo, { dimensions: dims })).toEqual([]);
    expect(searchSpecSchema.safeParse({ dimensions: dims.slice(0, 1), maxVariants: 10, iterations: 1000, seed: "s", fromFieldLog: fromLog }).success).toBe(true);
    const bad = searchSpecSchema.safeParse({ dimensions: dims.slice(0, 1), maxVariants: 10, iterations: 1000, seed: "s", fromFieldLog: { dataDate: "June" } });
    expect(bad.error!.issues[0].path).toEqual(["fromFieldLog", "dataDate"]);
  });

  it("refuses a spec without dimensions, in words", () => {
    const r = searchSpecSchema.safeParse({ dimensions: [], maxVariants: 10, iterations: 1000, seed: "s" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe("choose at least one thing to vary");
  });
});

describe("work budget of a job and a search", () => {
  // The demo deck: 84 packets, 7 operations ⇒ 84 × 7 × 7 + 2,192 = 6,308 units per iteration.
  const s = { deck: { lengthFt: 8400, packetFt: 100 }, operations: new Array(7).fill(0) };

  it("the iterations that fit are the most within each budget", () => {
    expect(runWork(s, 1).perIteration).toBe(6_308);
    for (const [place, budget] of [["server", SERVER_WORK_BUDGET], ["browser", BROWSER_WORK_BUDGET]] as const) {
      const fit = iterationsThatFit(s, place);
      expect(runWork(s, fit).total).toBeLessThanOrEqual(budget);
      expect(runWork(s, fit + 1).total).toBeGreaterThan(budget);
    }
  });

  it("a search fits when every plan fits one server run and all of them the search budget", () => {
    expect(searchBudgetProblem(s, 1_000, 61)).toBeNull(); // the form's default: 60 variants and the plan
    const whole = searchBudgetProblem(s, 5_000, 201); // 201 × 5,000 × 6,308 = 6,339,540,000 units
    expect(whole?.path).toBe("spec.iterations");
    expect(whole?.message).toContain(`${(6_339_540_000 / SEARCH_WORK_BUDGET).toFixed(1)} times the limit of ${SEARCH_WORK_BUDGET.toLocaleString("en-US")}`);
    const onePlan = searchBudgetProblem(s, iterationsThatFit(s, "server") + 1, 2);
    expect(onePlan?.message).toMatch(/^each plan of the search is one run: .*for a run the server computes/);
  });

  it("gives a longer time limit to more work, within bounds", () => {
    expect(timeLimitSeconds(0)).toBe(60);
    expect(timeLimitSeconds(SERVER_WORK_BUDGET)).toBeGreaterThan(timeLimitSeconds(1_000_000));
    expect(timeLimitSeconds(1e12)).toBe(900);
  });
});
