/**
 * The queue-limit contract (sim/queue-limit.ts): miles of queue or minutes of delay, one unit and one value;
 * scenarios saved before it existed read as 1 mile; bad values are refused naming the field; the days of a run
 * over the limit, in either unit.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseScenario } from "../../sim/validate";
import { fieldLabel } from "../../sim/field-labels";
import { breaksLimit, daysOverLimit, DEFAULT_QUEUE_LIMIT, describeQueueLimit, lastVehicleDelayMinutes, queueLimitOf, queueLimitSchema } from "../../sim/queue-limit";

const read = (rel: string) => JSON.parse(readFileSync(new URL(rel, import.meta.url), "utf8"));

describe("the queue limit in the scenario", () => {
  it("a scenario saved before the limit existed (version 1, and version 2 without it) loads with 1 mile", () => {
    for (const rel of ["../fixtures/saved-v1-kestrel-two-season.json", "../fixtures/before-closure-advice/kestrel-two-season.json"]) {
      const raw = read(rel);
      expect(JSON.stringify(raw)).not.toContain("queueLimit");
      const p = parseScenario(raw);
      expect(p.ok, rel).toBe(true);
      if (p.ok) expect(p.scenario.traffic!.queueLimit).toEqual({ unit: "miles", value: 1 });
    }
    expect(DEFAULT_QUEUE_LIMIT).toEqual({ unit: "miles", value: 1 });
  });

  it("a limit in minutes is kept as written and read back by queueLimitOf", () => {
    const raw = read("../../scenarios/kestrel-two-season.json");
    raw.traffic.queueLimit = { unit: "minutes", value: 15 };
    const p = parseScenario(raw);
    expect(p.ok).toBe(true);
    if (p.ok) expect(queueLimitOf(p.scenario)).toEqual({ unit: "minutes", value: 15 });
    expect(queueLimitOf(null)).toEqual(DEFAULT_QUEUE_LIMIT);
  });

  it("bad limits are refused with the field named in words", () => {
    const raw = read("../../scenarios/kestrel-two-season.json");
    const cases: [unknown, string][] = [
      [{ unit: "minutes", value: 0 }, "must be at least 1 minute"],
      [{ unit: "minutes", value: 900 }, "must be at most 600 minutes"],
      [{ unit: "miles", value: 0.01 }, "must be at least 0.1 mile"],
      [{ unit: "miles", value: 250 }, "must be at most 100 miles"],
    ];
    for (const [limit, message] of cases) {
      const p = parseScenario({ ...raw, traffic: { ...raw.traffic, queueLimit: limit } });
      expect(p.ok).toBe(false);
      if (!p.ok) expect(p.problems).toContainEqual({ path: "traffic.queueLimit.value", message });
    }
    const unit = parseScenario({ ...raw, traffic: { ...raw.traffic, queueLimit: { unit: "hours", value: 1 } } });
    expect(unit.ok).toBe(false);
    if (!unit.ok) expect(unit.problems[0].path).toBe("traffic.queueLimit.unit");
    expect(queueLimitSchema.safeParse({ unit: "miles", value: Number.NaN }).success).toBe(false);
    expect(fieldLabel("traffic.queueLimit.value")).toBe("Traffic › Queue limit › Value");
  });
});

describe("measuring a queue against the limit", () => {
  it("D/D/1: the last vehicle of a queue waits queue / discharge rate", () => {
    // Source: D/D/1 queueing, Mannering & Washburn, Principles of Highway Engineering and Traffic Analysis,
    // queuing chapter — from memory. 550 veh at 1,500 veh/h: 550 / 1,500 h = 0.36667 h = 22 min; 300 veh at
    // 1,800 veh/h: 1/6 h = 10 min; no queue, no wait.
    expect(lastVehicleDelayMinutes(550, 1500)).toBeCloseTo(22, 9);
    expect(lastVehicleDelayMinutes(300, 1800)).toBeCloseTo(10, 9);
    expect(lastVehicleDelayMinutes(0, 1500)).toBe(0);
  });

  it("strictly over the limit breaks it; a limit in minutes with no minutes known cannot be judged", () => {
    expect(breaksLimit({ unit: "miles", value: 1 }, { miles: 1 })).toBe(false);
    expect(breaksLimit({ unit: "miles", value: 1 }, { miles: 1.01, minutes: 3 })).toBe(true);
    expect(breaksLimit({ unit: "minutes", value: 15 }, { miles: 9, minutes: 14.9 })).toBe(false);
    expect(breaksLimit({ unit: "minutes", value: 15 }, { miles: 0.2, minutes: 15.5 })).toBe(true);
    expect(breaksLimit({ unit: "minutes", value: 15 }, { miles: 0.2 })).toBeNull();
  });

  it("the days over the limit, in either unit; null for a minutes limit on a run without delay minutes", () => {
    const days = [
      { date: "2027-05-03", peakQueueMiles: 0.4, peakDelayMinutes: 18 },
      { date: "2027-05-04", peakQueueMiles: 1.6, peakDelayMinutes: 12 },
      { date: "2027-05-05", peakQueueMiles: 2.2, peakDelayMinutes: 31 },
    ];
    expect(daysOverLimit(days, { unit: "miles", value: 1 })!.map((d) => d.date)).toEqual(["2027-05-04", "2027-05-05"]);
    expect(daysOverLimit(days, { unit: "minutes", value: 15 })!.map((d) => d.date)).toEqual(["2027-05-03", "2027-05-05"]);
    const old = days.map(({ date, peakQueueMiles }) => ({ date, peakQueueMiles }));
    expect(daysOverLimit(old, { unit: "miles", value: 1 })!.length).toBe(2);
    expect(daysOverLimit(old, { unit: "minutes", value: 15 })).toBeNull();
  });

  it("in words", () => {
    expect(describeQueueLimit({ unit: "miles", value: 1 })).toBe("1 mile of queue");
    expect(describeQueueLimit({ unit: "miles", value: 2.5 })).toBe("2.5 miles of queue");
    expect(describeQueueLimit({ unit: "minutes", value: 15 })).toBe("15 minutes of delay");
  });
});
