/** The work budget checked before every run, and the strict run-summary contract a client's run must meet. */
import { describe, expect, it } from "vitest";
import { BROWSER_WORK_BUDGET, budgetProblem, runWork, SERVER_WORK_BUDGET } from "../../sim/budget";
import { HORIZON_DAYS } from "../../sim/calendar";
import { runScenario } from "../../sim/index";
import { runSummarySchema } from "../../sim/run-summary-schema";
import type { Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { MAX_SERVER_ITERATIONS } from "../../src/lib/schemas";
import { loadScenario, small } from "./engine-fixtures";

const parsed = (input: unknown): Scenario => {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
};
const DEMOS = ["kestrel-two-season.json", "kestrel-single-season.json", "kestrel-holiday-work.json", "kestrel-two-placement-crews.json", "kestrel-staged-three-lane.json", "small-deterministic.json"];

describe("work budget", () => {
  it("counts packets × operations × 7 + weather days, per iteration", () => {
    const s = parsed(loadScenario("kestrel-two-season.json"));
    // 8,400 ft in 100 ft packets, seven operations.
    expect(runWork(s, 10)).toEqual({ packets: 84, operations: 7, perIteration: 84 * 7 * 7 + HORIZON_DAYS, total: 10 * (84 * 7 * 7 + HORIZON_DAYS) });
  });

  it("links do not change the units: a plan without links costs the engine as much per packet as one with them", () => {
    const s = parsed(loadScenario("kestrel-two-season.json"));
    const unlinked = parsed({ ...loadScenario("kestrel-two-season.json"), links: [] });
    expect(unlinked.links).toHaveLength(0);
    expect(runWork(unlinked, 1).perIteration).toBe(runWork(s, 1).perIteration);
  });

  it("counts each operation once per stage it works in", () => {
    const one = parsed(small());
    const ops = one.operations.length;
    const twelve = parsed(small((s) => (s.stages = Array.from({ length: 12 }, (_, i) => ({ id: `st${i}`, name: `Stage ${i + 1}`, lanes: ["L1", "L2"], standingLanesClosed: [] })))));
    expect(runWork(one, 1).operations).toBe(ops);
    expect(runWork(twelve, 1).operations).toBe(12 * ops);
    const some = parsed(small((s) => (s.stages = [{ id: "a", name: "A", lanes: ["L1"], operations: [s.operations[0].id] }, { id: "b", name: "B", lanes: ["L2"] }])));
    expect(runWork(some, 1).operations).toBe(1 + ops);
    expect(runWork(twelve, 1).perIteration - HORIZON_DAYS).toBe(12 * (runWork(one, 1).perIteration - HORIZON_DAYS));
  });

  it("every demo scenario may run 20,000 iterations in the browser and the server's maximum on the server", () => {
    for (const f of DEMOS) {
      const s = parsed(loadScenario(f));
      expect(budgetProblem(s, 20_000, "browser"), f).toBeNull();
      expect(budgetProblem(s, MAX_SERVER_ITERATIONS, "server"), f).toBeNull();
    }
  });

  it("5,000 packets × 40 operations at 5,000 iterations is refused, saying which limit and by how much", () => {
    const s = parsed(
      small((s) => {
        s.deck.lengthFt = 50_000;
        s.deck.packetFt = 10;
        const proto = s.operations[0];
        s.operations = Array.from({ length: 40 }, (_, i) => ({ ...proto, id: `op-${i}`, name: `Operation ${i}` }));
        s.links = [];
      }),
    );
    for (const place of ["browser", "server"] as const) {
      const p = budgetProblem(s, 5_000, place);
      const budget = place === "server" ? SERVER_WORK_BUDGET : BROWSER_WORK_BUDGET;
      const total = 5_000 * (5_000 * 40 * 7 + HORIZON_DAYS);
      expect(p?.path).toBe("iterations");
      expect(p?.message).toContain(`needs ${total.toLocaleString("en-US")} work units`);
      expect(p?.message).toContain(`${(total / budget).toFixed(1)} times`);
      expect(p?.message).toContain(budget.toLocaleString("en-US"));
    }
    // It says how many iterations would fit.
    const fits = Math.floor(BROWSER_WORK_BUDGET / (5_000 * 40 * 7 + HORIZON_DAYS));
    expect(budgetProblem(s, 5_000, "browser")?.message).toContain(`At most ${fits} iterations fit`);
  });

  it("the limit is inclusive: exactly the budget runs, one more iteration does not", () => {
    const s = parsed(small());
    const per = runWork(s, 1).perIteration;
    const fit = Math.floor(SERVER_WORK_BUDGET / per);
    expect(budgetProblem(s, fit, "server")).toBeNull();
    expect(budgetProblem(s, fit + 1, "server")).not.toBeNull();
  });
});

describe("run-summary contract", () => {
  it("what the engine produces passes the strict schema after a JSON round trip, unchanged", () => {
    for (const f of ["kestrel-two-season.json", "kestrel-staged-three-lane.json", "small-deterministic.json"]) {
      const summary = runScenario(parsed(loadScenario(f)), { iterations: 20, seed: "contract" });
      const wire = JSON.parse(JSON.stringify(summary));
      const r = runSummarySchema.safeParse(wire);
      expect(r.success, `${f}: ${JSON.stringify(r.error?.issues.slice(0, 3))}`).toBe(true);
      expect(r.data).toEqual(summary);
    }
  });

  it("refuses an unknown field at any depth, naming it", () => {
    const summary = JSON.parse(JSON.stringify(runScenario(parsed(loadScenario("small-deterministic.json")), { iterations: 10, seed: "x" })));
    summary.junk = "x".repeat(1000);
    summary.finish.p95 = "2027-05-01";
    summary.representative.trace.packets[0].note = "hi";
    const r = runSummarySchema.safeParse(summary);
    const unknown = r.error!.issues.filter((i) => i.code === "unrecognized_keys").map((i) => [i.path.join("."), i.keys.join()]);
    expect(unknown).toEqual(expect.arrayContaining([["", "junk"], ["finish", "p95"], ["representative.trace.packets.0", "note"]]));
  });

  it("refuses a probability above 1 and strings that are not dates", () => {
    const summary = JSON.parse(JSON.stringify(runScenario(parsed(loadScenario("kestrel-two-season.json")), { iterations: 10, seed: "x" })));
    summary.target.probability = 1.5;
    summary.finish.p80 = "soon";
    const paths = runSummarySchema.safeParse(summary).error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["target.probability", "finish.p80"]));
  });

  it("a plan that never finishes (a pour no day allows) round-trips with its unfinished packets as Infinity", () => {
    // Overlay needs 120 °F air: no hour of the fixed climate reaches it, so every iteration hits the horizon and
    // the representative trace holds packets with no start or finish (Infinity, null over JSON).
    const never = parsed(small((s) => {
      const overlay = (s.operations as { id: string; gates?: Record<string, unknown> }[]).find((o) => o.id === "overlay")!;
      overlay.gates = { ...overlay.gates, minTempF: 120 };
    }));
    const summary = runScenario(never, { iterations: 4, seed: "never" });
    expect(summary.representative.finishHours).toBe(Infinity);
    const open = summary.representative.trace.packets.filter((p) => !Number.isFinite(p.finish));
    expect(open.length).toBeGreaterThan(0);
    const r = runSummarySchema.safeParse(JSON.parse(JSON.stringify(summary)));
    expect(r.success, JSON.stringify(r.error?.issues.slice(0, 3))).toBe(true);
    expect(r.data).toEqual(summary);
  });

  it("reads an unfinished representative (null over JSON) back as Infinity", () => {
    const summary = JSON.parse(JSON.stringify(runScenario(parsed(loadScenario("small-deterministic.json")), { iterations: 10, seed: "x" })));
    summary.representative.finishHours = null;
    expect(runSummarySchema.parse(summary).representative.finishHours).toBe(Infinity);
  });
});
