/** Plain words for the advisor: clock times, runs of good start hours (through midnight), the warning text. */
import { describe, expect, it } from "vitest";
import type { ClosureAdvice } from "../../sim/advisor";
import { breachWarning, clock, goodStartRuns } from "../../src/lib/closure-advice-text";

function advice(longest: number[], planned: ClosureAdvice["planned"] = null): ClosureAdvice {
  return {
    closure: "night",
    withStage: null,
    name: "Night closure",
    kind: "short",
    lanes: ["L2"],
    dayKind: "friday",
    planned,
    hours: longest.map((l, hour) => ({ hour, demand: 0, capacity: 1000, longestClosureFrom: l, plannedQueueMiles: 0, plannedDelayMinutes: 0 })),
  };
}

describe("closure advice in words", () => {
  it("clock: fractions are minutes, 24 wraps to midnight", () => {
    expect([clock(15.5), clock(24), clock(0), clock(9.25)]).toEqual(["15:30", "00:00", "00:00", "09:15"]);
  });

  it("good start hours: a run through midnight is one run, several runs are listed in clock order after the first bad hour", () => {
    const l = Array<number>(24).fill(0);
    for (const h of [20, 21, 22, 23, 0, 1, 2]) l[h] = 9;
    l[12] = 9;
    expect(goodStartRuns(advice(l), 9)).toEqual(["12:00", "20:00–02:00"]);
    expect(goodStartRuns(advice(l), 10)).toEqual([]);
    expect(goodStartRuns(advice(Array<number>(24).fill(24)), 9)).toEqual(["any hour"]);
  });

  it("a planned window over the limit is a warning with the expected queue; within it, none", () => {
    const planned = { windows: [{ start: 9, end: 15.5 }], peakQueueVeh: 3450, peakQueueMiles: 6.29, peakDelayMinutes: 71.2, peakHour: 15, direction: "n", breaks: true };
    expect(breachWarning(advice(Array(24).fill(0), planned), { unit: "miles", value: 1 })).toBe(
      "Night closure on Fridays, open 09:00–15:30: the queue reaches 6.3 mi (3,450 vehicles, 71 minutes of delay) around 15:00 — over the limit of 1 mile of queue.",
    );
    expect(breachWarning(advice(Array(24).fill(0), { ...planned, breaks: false }), { unit: "miles", value: 1 })).toBeNull();
  });
});
