/**
 * The progress sentences of many plans (the project list; every project's forecast e-mail) are made plan by plan:
 * one plan whose sentence throws has none, is logged by its id and the error's class (never the message, which may
 * quote data), and every other plan still has its sentence.
 */
import { readFileSync } from "node:fs";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { eachPlanLog } from "@/lib/server/plan-progress";
import type { FieldLogRecord } from "@/lib/progress-to-date";

const definition = JSON.parse(readFileSync("scenarios/kestrel-two-season.json", "utf8"));
// The sentence maker below reads no field of a shift; one stands for "the log has shifts".
const someShifts = [{ id: "e1" } as unknown as FieldLogRecord];
const log = (scenarioId: string, over: Partial<{ definition: unknown; entries: FieldLogRecord[] }> = {}) => ({ scenarioId, definition, entries: someShifts, ...over });

let logged: string[];
beforeEach(() => {
  logged = [];
  vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => void logged.push(args.join(" ")));
});
afterEach(() => vi.restoreAllMocks());

describe("eachPlanLog", () => {
  it("keeps every other plan's sentence when one plan's throws, and logs that plan once without the message", async () => {
    const make = (plan: { name: string }, l: { scenarioId: string }) => {
      if (l.scenarioId === "plan-odd") throw new RangeError("station 12+00 of Kestrel Creek for jane@example.com");
      return `${plan.name}: sentence`;
    };
    const first = await eachPlanLog([log("plan-odd"), log("plan-a"), log("plan-b")], make);
    expect([...first.keys()]).toEqual(["plan-a", "plan-b"]);
    expect(first.get("plan-a")).toBe(`${definition.name}: sentence`);
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatch(/^\[pourline\] progress sentence for plan-odd failed: RangeError/);
    expect(logged[0]).not.toContain("jane@example.com");
    // The next page load or pass fails the same way: not logged again.
    await eachPlanLog([log("plan-odd")], make);
    expect(logged).toHaveLength(1);
  });

  it("has no sentence for a plan with no shifts, or one that no longer parses, and does not call make for them", async () => {
    const asked: string[] = [];
    const out = await eachPlanLog([log("empty", { entries: [] }), log("broken", { definition: { name: 3 } }), log("fine")], (_p, l) => (asked.push(l.scenarioId), "ok"));
    expect(asked).toEqual(["fine"]);
    expect([...out]).toEqual([["fine", "ok"]]);
    expect(logged).toEqual([]);
  });
});
