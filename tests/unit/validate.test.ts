import { describe, expect, it } from "vitest";
import { parseScenario } from "../../sim/validate";
import type { CrewOperation } from "../../sim/schema";
import { loadScenario, small } from "./engine-fixtures";

const problemsOf = (input: unknown) => {
  const r = parseScenario(input);
  if (r.ok) throw new Error("expected problems");
  return r.problems;
};
const crew = (s: ReturnType<typeof small>, i: number) => s.operations[i] as CrewOperation;

describe("parseScenario", () => {
  it("accepts every shipped scenario and fills defaults", () => {
    for (const f of ["small-deterministic.json"]) {
      const r = parseScenario(loadScenario(f));
      expect(r.ok, f).toBe(true);
      if (r.ok) expect(crew(r.scenario as never, 0).mobilizationHours).toBe(0);
    }
  });

  it("reports every structural problem at once, with paths", () => {
    const s = small((s) => {
      s.deck.lengthFt = -5;
      crew(s, 0).crews = 0;
      (s.operations[1] as CrewOperation).rate.dist = { type: "triangular", min: 10, mode: 5, max: 20 };
    });
    const paths = problemsOf(s).map((p) => p.path);
    expect(paths).toContain("deck.lengthFt");
    expect(paths).toContain("operations[0].crews");
    expect(paths).toContain("operations[1].rate.dist.mode");
  });

  it("names unknown ids and duplicates", () => {
    const s = small((s) => {
      crew(s, 0).closure = "nowhere";
      crew(s, 1).shifts = ["night"];
      s.links.push({ from: "milling", to: "curing" });
      s.operations[1].id = "milling";
    });
    const ps = problemsOf(s);
    expect(ps).toContainEqual({ path: "operations[0].closure", message: 'unknown closure "nowhere"' });
    expect(ps).toContainEqual({ path: "operations[1].shifts[0]", message: 'unknown shift "night"' });
    expect(ps).toContainEqual({ path: "links[1].to", message: 'unknown operation "curing"' });
    expect(ps.find((p) => p.path === "operations[1].id")?.message).toMatch(/duplicate operation id "milling"/);
  });

  it("finds a precedence cycle and spells it out", () => {
    const s = small((s) => {
      s.links.push({ from: "overlay", to: "milling" });
    });
    const p = problemsOf(s).find((p) => p.message.startsWith("links form a cycle"));
    expect(p).toEqual({ path: "links[1]", message: "links form a cycle: milling → overlay → milling" });
  });

  it("rejects lags longer than the deck, stations off the deck and a cut-off on a single-season plan", () => {
    const s = small((s) => {
      s.links[0].lagFt = 1200;
      s.deck.survey = [{ fromStationFt: 900, toStationFt: 1300, probability: 0.5 }];
      s.calendar.season.cutoffStationFt = 5000;
    });
    const ps = problemsOf(s);
    expect(ps.map((p) => p.path)).toEqual(
      expect.arrayContaining(["links[0].lagFt", "deck.survey[0].toStationFt", "calendar.season.cutoffStationFt"]),
    );
    expect(ps.find((p) => p.path === "links[0].lagFt")!.message).toBe("lag of 1200 ft is longer than the deck (1000 ft)");
    expect(ps.filter((p) => p.path === "calendar.season.cutoffStationFt")).toHaveLength(2);
  });

  it("rejects shifts that never meet a closure window", () => {
    const s = small((s) => {
      s.calendar.shifts.push({ id: "night", name: "Night", startHour: 20, lengthHours: 8 });
      crew(s, 0).shifts = ["night"];
    });
    const p = problemsOf(s).find((p) => p.path === "operations[0].shifts");
    expect(p?.message).toMatch(/never overlap a window of closure "one-lane"/);
  });

  it("rejects a continuous packet that can never fit one open interval, even at the fastest rate", () => {
    // 100 ft at most 8 ft/h needs 12.5 h; the longest open interval is 10 h (07:00–17:00).
    const s = small((s) => {
      crew(s, 1).rate = { unit: "ftPerHour", dist: { type: "triangular", min: 2, mode: 5, max: 8 } };
    });
    const p = problemsOf(s).find((p) => p.path === "operations[1]");
    expect(p?.message).toMatch(/needs 12.5 h .* longest usable interval is 10 h: the scenario can never finish/);
    // At 10 ft/h the packet needs exactly the 10 h available: accepted.
    const ok = small((s) => {
      crew(s, 1).rate = { unit: "ftPerHour", dist: { type: "fixed", value: 10 } };
    });
    expect(parseScenario(ok).ok).toBe(true);
  });

  it("does not limit a rising gate to clock hours: a warm night can rise (MODEL.md, rising judged from temperature)", () => {
    // Open 17:00–22:00 only, 4 h packets. "Rising" is T(k+1) ≥ T(k) from the weather, so an evening start is
    // possible when the next morning's minimum is above the afternoon's maximum: nothing to refuse here.
    const s = small((s) => {
      s.calendar.closureWindows[0].startHour = 17;
      s.calendar.closureWindows[0].endHour = 22;
      s.calendar.shifts[0].startHour = 17;
      s.calendar.shifts[0].lengthHours = 5;
      crew(s, 1).gates = { rising: true };
      crew(s, 1).rate = { unit: "ftPerHour", dist: { type: "fixed", value: 25 } }; // 4 h per packet
      crew(s, 0).gates = { rising: true }; // non-continuous, never open 06–15
    });
    expect(parseScenario(s).ok).toBe(true);
    // The fit check itself still holds: 6 h packets do not fit the 5 h interval.
    const tight = small((s) => {
      s.calendar.closureWindows[0].startHour = 17;
      s.calendar.closureWindows[0].endHour = 22;
      s.calendar.shifts[0].startHour = 17;
      s.calendar.shifts[0].lengthHours = 5;
      crew(s, 1).gates = { rising: true };
      crew(s, 1).rate = { unit: "ftPerHour", dist: { type: "fixed", value: 100 / 6 } };
    });
    expect(problemsOf(tight).find((p) => p.path === "operations[1]")?.message).toMatch(/longest usable interval is 5 h/);
  });

  it("refuses a maximum temperature below the minimum and a half-filled protection window, naming the field", () => {
    const s = small((s) => {
      crew(s, 1).gates = { minTempF: 50, maxTempF: 40, protectAfter: { minTempF: 35 } };
    });
    const problems = problemsOf(s);
    expect(problems).toContainEqual({ path: "operations[1].gates.maxTempF", message: "must be ≥ the minimum temperature" });
    expect(problems.find((p) => p.path === "operations[1].gates.protectAfter.hours")?.message).toMatch(/how many hours/);
    const ok = small((s) => {
      crew(s, 1).gates = { minTempF: 50, maxTempF: 90, protectAfter: { minTempF: 35, hours: 12 } };
    });
    expect(parseScenario(ok).ok).toBe(true);
  });

  it("rejects a zero rate and a cut-off date after the first winter", () => {
    const s = small((s) => {
      crew(s, 0).rate = { unit: "ftPerHour", dist: { type: "fixed", value: 0 } };
      s.calendar.season = { plan: "two", winterStart: "12-01", winterEnd: "03-15", cutoffDate: "2027-12-20" };
    });
    const paths = problemsOf(s).map((p) => p.path);
    expect(paths).toEqual(expect.arrayContaining(["operations[0].rate.dist.value", "calendar.season.cutoffDate"]));
  });

  it("accepts a lognormal production rate (positive by construction) and still refuses a zero minimum", () => {
    const ok = parseScenario(small((s) => (crew(s, 0).rate = { unit: "ftPerHour", dist: { type: "lognormal", median: 40, sigma: 0.3 } })));
    expect(ok.ok).toBe(true);
    const bad = small((s) => (crew(s, 0).rate = { unit: "ftPerHour", dist: { type: "triangular", min: 0, mode: 30, max: 50 } }));
    expect(problemsOf(bad).map((p) => p.path)).toContain("operations[0].rate.dist.min");
  });
});
