/**
 * The printed brief's traffic facts (src/lib/brief-traffic.ts) read off a run: one closure-plan row per
 * closure with exactly the periods of the closure timeline, the longest backups in order, and the days over the
 * plan's queue limit in its unit.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseScenario, runScenario } from "../../sim/index";
import { closurePlanRows, limitCheck, longestBackups } from "../../src/lib/brief-traffic";

const load = (f: string) => {
  const p = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${f}`, import.meta.url), "utf8")));
  if (!p.ok) throw new Error(JSON.stringify(p.problems));
  return p.scenario;
};

describe("the brief's closure plan", () => {
  for (const file of ["kestrel-two-season.json", "kestrel-staged-three-lane.json"]) {
    it(`${file}: one row per closure, with the timeline's periods, first and last day, and P50 lane-closed hours`, () => {
      const s = load(file);
      const run = runScenario(s, { iterations: 6, seed: "brief" });
      const rows = closurePlanRows(s, run);
      const tl = run.representative.closureTimeline;
      expect(rows.map((r) => r.closure)).toEqual(run.laneClosedHours.byClosure.map((c) => c.closure));
      expect(rows.reduce((n, r) => n + r.periods, 0)).toBe(tl.length);
      for (const r of rows) {
        const mine = tl.filter((p) => p.closure === r.closure);
        expect(r.periods).toBe(mine.length);
        if (mine.length) {
          expect(r.first).toBe(mine[0].start.slice(0, 10));
          expect(r.last).toBe(mine.at(-1)!.end.slice(0, 10));
        }
        expect(r.laneHoursP50).toBe(run.laneClosedHours.byClosure.find((c) => c.closure === r.closure)!.p50);
        if (r.kind === "short") expect(r.hours).toMatch(/\d{2}:\d{2}–\d{2}:\d{2}/);
        else expect(r.hours).toBe("round the clock while its stage is worked");
      }
      if (file.includes("staged")) expect(rows.some((r) => r.kind === "standing")).toBe(true);
    });
  }
});

describe("backups and the queue limit", () => {
  const s = load("kestrel-two-season.json");
  const run = runScenario(s, { iterations: 6, seed: "brief" });

  it("the longest backups come longest first, the first being the run's longest queue", () => {
    const top = longestBackups(run, 5);
    expect(top.length).toBe(5);
    expect(top[0].peakQueueMiles).toBe(run.traffic!.maxQueue!.miles);
    for (let i = 1; i < top.length; i++) expect(top[i].peakQueueMiles).toBeLessThanOrEqual(top[i - 1].peakQueueMiles);
    const fifth = top[4].peakQueueMiles;
    expect(run.traffic!.days.filter((d) => d.peakQueueMiles > fifth).length).toBeLessThanOrEqual(4);
  });

  it("the days over the limit follow the plan's unit: miles of queue, or minutes of delay", () => {
    const miles = limitCheck(s, run)!;
    expect(miles.limit).toEqual({ unit: "miles", value: 1 });
    expect(miles.days!.map((d) => d.date)).toEqual(run.traffic!.days.filter((d) => d.peakQueueMiles > 1).map((d) => d.date));
    const inMinutes = { ...s, traffic: { ...s.traffic!, queueLimit: { unit: "minutes" as const, value: 30 } } };
    const minutes = limitCheck(inMinutes, run)!;
    expect(minutes.days!.map((d) => d.date)).toEqual(run.traffic!.days.filter((d) => d.peakDelayMinutes! > 30).map((d) => d.date));
    expect(minutes.days!.length).toBeGreaterThan(0);
    expect(limitCheck(s, { traffic: undefined })).toBeNull();
  });
});
