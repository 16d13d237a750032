// Shaded stand-downs from the compiled calendar: winters (with demobilization) apart from holiday blocks.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compileCalendar, compileStandDowns } from "@sim/calendar";
import { parseScenario } from "@sim/validate";
import type { Scenario } from "@sim/schema";
import { standDowns } from "@/components/results/stand-downs";

function small(edit: (s: any) => void = () => {}): Scenario {
  const raw = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
  edit(raw);
  const r = parseScenario(raw);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}

// Start 2027-04-05 (day 0). Hand count: 1 May = day 26, 28 May = day 53, 31 May = day 56, 1 Dec = day 240;
// 1 Dec 2027 → 15 Mar 2028 is 31 + 31 + 29 + 14 = 105 days (2028 is a leap year) → day 345.
describe("standDowns", () => {
  it("Memorial Day 2027 (Mon 31 May) stands down from 15:00 Fri 28 May to 24:00 Mon 31 May; winter 1 Dec – 15 Mar", () => {
    // Source: 5 U.S.C. 6103 (last Monday of May) and MODEL.md "Holiday stand-down" (weekend extension, 15:00 the day before).
    const s = small();
    const bands = standDowns(compileCalendar(s, 400), 0, 0, 24 * 400);
    expect(bands).toContainEqual({ kind: "holiday", start: 24 * 53 + 15, end: 24 * 57 });
    expect(bands).toContainEqual({ kind: "winter", start: 24 * 240, end: 24 * 345 });
    for (const w of bands.filter((b) => b.kind === "winter"))
      for (const h of bands.filter((b) => b.kind === "holiday")) expect(h.end <= w.start || h.start >= w.end).toBe(true);
    expect(bands.map((b) => b.start)).toEqual([...bands.map((b) => b.start)].sort((a, b) => a - b));
  });

  it("demobilization hours widen the winter band; a holiday inside the winter is not drawn twice", () => {
    const s = small((raw) => (raw.calendar.season.demobilizeHours = 48));
    const bands = standDowns(compileCalendar(s, 400), 48, 0, 24 * 400);
    const winter = bands.find((b) => b.kind === "winter")!;
    expect(winter.start).toBe(24 * 240 - 48);
    // Christmas and New Year fall inside the winter: no holiday band overlaps it.
    expect(bands.filter((b) => b.kind === "holiday" && b.start < winter.end && b.end > winter.start)).toEqual([]);
  });

  it("workThrough blocks no holidays; bands are clipped to the window asked for", () => {
    const s = small((raw) => (raw.calendar.holidays.policy = "workThrough"));
    const bands = standDowns(compileCalendar(s, 400), 0, 24 * 300, 24 * 310);
    expect(bands).toEqual([{ kind: "winter", start: 24 * 300, end: 24 * 310 }]);
  });
});

describe("compileStandDowns (the chart's stand-downs without the operations' work windows)", () => {
  const demos = ["kestrel-two-season.json", "kestrel-single-season.json", "kestrel-holiday-work.json", "kestrel-staged-three-lane.json", "kestrel-two-placement-crews.json", "small-deterministic.json"];
  it.each(demos)("gives %s the same blocks and winters as compileCalendar, for short and long horizons", (file) => {
    const raw = JSON.parse(readFileSync(new URL(`../../scenarios/${file}`, import.meta.url), "utf8"));
    const r = parseScenario(raw);
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    for (const days of [1, 40, 400, 900]) {
      const full = compileCalendar(r.scenario, days);
      const alone = compileStandDowns(r.scenario, days);
      expect(alone.blocked).toEqual(full.blocked);
      expect(alone.winterStarts).toEqual(full.winterStarts);
      expect(alone.winterEnds).toEqual(full.winterEnds);
    }
  });
});
