// Pure helpers of the plan editor: refused links, layout by depth, definition diffs, problem-path mapping.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseScenario } from "@sim/validate";
import {
  convertDist,
  diffDefinitions,
  findPath,
  freshId,
  normalizeDefinition,
  proposeLink,
  sectionOf,
  toFormPath,
  toFormValues,
} from "@/components/plan-editor/plan-logic";

const ops = ["setup", "milling", "cleanup", "placement", "cure"];
const chain = [
  { from: "setup", to: "milling" },
  { from: "milling", to: "cleanup" },
  { from: "cleanup", to: "placement" },
  { from: "placement", to: "cure" },
];

describe("proposeLink", () => {
  it("accepts a link that keeps the graph acyclic", () => {
    expect(proposeLink(ops, chain, "setup", "cleanup")).toEqual({ ok: true });
  });
  it("refuses a back link and names the loop in order", () => {
    const v = proposeLink(ops, chain, "cleanup", "milling");
    expect(v).toEqual({ ok: false, message: "Refused: cleanup → milling → cleanup would loop." });
  });
  it("names a longer loop through every operation on it, using display labels", () => {
    const v = proposeLink(ops, chain, "cure", "milling", (id) => id.toUpperCase());
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.message).toBe("Refused: CURE → MILLING → CLEANUP → PLACEMENT → CURE would loop.");
  });
  it("refuses self-links, duplicates and unknown operations", () => {
    expect(proposeLink(ops, chain, "cure", "cure").ok).toBe(false);
    expect(proposeLink(ops, chain, "setup", "milling")).toEqual({ ok: false, message: "Refused: setup → milling is already linked." });
    expect(proposeLink(ops, chain, "setup", "ghost").ok).toBe(false);
  });
  it("agrees with the engine's validator: every refused link would be reported as a cycle, every accepted one not", () => {
    const file = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
    const base = { ...file, operations: ops.map((id) => ({ ...file.operations[0], id })), links: chain.slice(0, 3).map((l) => ({ ...l, lagFt: 0, lagHours: 0 })) };
    const ids = ops;
    let refused = 0;
    for (const from of ids) {
      for (const to of ids) {
        if (from === to || base.links.some((l: { from: string; to: string }) => l.from === from && l.to === to)) continue;
        const links = [...base.links, { from, to, lagFt: 0, lagHours: 0 }];
        const parsed = parseScenario({ ...base, links });
        const cycleReported = !parsed.ok && parsed.problems.some((p) => p.message.includes("cycle"));
        const verdict = proposeLink(ids, base.links, from, to);
        expect(verdict.ok).toBe(!cycleReported);
        if (!verdict.ok) refused++;
      }
    }
    expect(refused).toBe(6); // back links among setup → milling → cleanup → placement: C(4,2)
  });
});

describe("findPath", () => {
  it("finds the shortest path or null", () => {
    expect(findPath([...chain, { from: "setup", to: "placement" }], "setup", "cure")).toEqual(["setup", "placement", "cure"]);
    expect(findPath(chain, "cure", "setup")).toBeNull();
  });
});

describe("diffDefinitions", () => {
  it("lists each changed leaf with a schema-style path, theirs → mine", () => {
    const theirs = { operations: [{ id: "a", rate: { dist: { type: "pert", min: 200, mode: 240, max: 300 } } }], links: [] };
    const mine = { operations: [{ id: "a", rate: { dist: { type: "pert", min: 200, mode: 260, max: 300 } } }], links: [{ from: "a", to: "b" }] };
    expect(diffDefinitions(theirs, mine)).toEqual([
      { path: "links[0]", before: "(not set)", after: '{"from":"a","to":"b"}' },
      { path: "operations[0].rate.dist.mode", before: "240", after: "260" },
    ]);
  });
  it("is empty for equal definitions and reports removed keys", () => {
    expect(diffDefinitions({ a: [1, { b: "x" }] }, { a: [1, { b: "x" }] })).toEqual([]);
    expect(diffDefinitions({ gates: { minTempF: 45 } }, { gates: {} })).toEqual([{ path: "gates.minTempF", before: "45", after: "(not set)" }]);
  });
  it("does not report defaults that one side left out once both are normalized", () => {
    const base = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
    const filled = normalizeDefinition(base);
    expect(diffDefinitions(base, filled).length).toBeGreaterThan(0); // defaults really were missing
    expect(diffDefinitions(normalizeDefinition(base), filled)).toEqual([]);
  });
});

describe("problem paths", () => {
  it("maps server and validator paths to react-hook-form names", () => {
    expect(toFormPath("definition.operations[3].rate.dist.max")).toBe("operations.3.rate.dist.max");
    expect(toFormPath("calendar.closureWindows[0].closure")).toBe("calendar.closureWindows.0.closure");
    expect(toFormPath("weather.monthly[11].tminMeanF")).toBe("weather.monthly.11.tminMeanF");
  });
  it("sends each problem to the section that shows its field", () => {
    expect(sectionOf("definition.operations[3].rate.dist.max")).toBe("crews");
    expect(sectionOf("operations[2]")).toBe("crews");
    expect(sectionOf("operations[2].name")).toBe("sequence");
    expect(sectionOf("links[1]")).toBe("sequence");
    expect(sectionOf("calendar.season.cutoffDate")).toBe("calendar");
    expect(sectionOf("startDate")).toBe("calendar");
    expect(sectionOf("weather.monthly[0].rhMean")).toBe("weather");
  });
  it("makes fresh ids that pass the schema's id rule and do not collide", () => {
    expect(freshId("Hydro-demolition (2nd pass)", [])).toBe("hydro-demolition-2nd-pass");
    expect(freshId("Cure", ["cure", "cure-2"])).toBe("cure-3");
    expect(freshId("!!!", [])).toBe("operation");
  });
});

describe("convertDist and toFormValues", () => {
  it("keeps the central value when the distribution type changes", () => {
    expect(convertDist({ type: "fixed", value: 240 }, "pert")).toEqual({ type: "pert", min: 192, mode: 240, max: 300 });
    expect(convertDist({ type: "pert", min: 1, mode: 2, max: 5 }, "triangular")).toEqual({ type: "triangular", min: 1, mode: 2, max: 5 });
    expect(convertDist({ type: "triangular", min: 1, mode: 2, max: 5 }, "lognormal")).toEqual({ type: "lognormal", median: 2, sigma: 0.2 });
    expect(convertDist({ type: "lognormal", median: 30, sigma: 0.4 }, "fixed")).toEqual({ type: "fixed", value: 30 });
  });
  it("fills every optional field so the form starts complete, and still parses to the same scenario", () => {
    const base = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
    const v = toFormValues(base);
    const op = v.operations[1];
    expect(op.kind === "crew" && Object.keys(op.gates ?? {}).sort()).toEqual(
      ["concreteDeltaF", "maxEvaporation", "maxTempF", "maxWindMph", "minTempF", "noRain", "noRainHoursAfter", "protectAfter", "rising"],
    );
    expect(op.kind === "crew" && op.gates?.protectAfter).toEqual({ minTempF: undefined, hours: undefined });
    expect(op.kind === "crew" && op.gates?.minTempF).toBe(45);
    const a = parseScenario(base);
    const b = parseScenario(JSON.parse(JSON.stringify(v)));
    expect(a.ok && b.ok).toBe(true);
    if (a.ok && b.ok) {
      // Only the explicit `false` switches differ, and the engine treats them like absent ones (`=== true`).
      expect(diffDefinitions(a.scenario, b.scenario).map((d) => d.after)).toEqual(["false", "false", "false", "false"]);
    }
  });
});
