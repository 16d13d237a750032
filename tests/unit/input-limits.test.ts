/** The scenario format's limits: lengths, real dates, IANA zones, control characters, and the messages naming them. */
import { describe, expect, it } from "vitest";
import { parseScenario } from "../../sim/validate";
import { LIMITS } from "../../sim/limits";
import { isKnownTimeZone, isRealIsoDate } from "../../sim/text";
import { fieldLabel } from "../../sim/field-labels";
import type { ScenarioInput } from "../../sim/schema";
import { progressEntrySchema, reforecastSchema } from "../../src/lib/progress-schema";
import { runWriteSchema, scenarioWriteSchema } from "../../src/lib/schemas";
import { loadScenario, small } from "./engine-fixtures";

const problemsOf = (input: unknown) => {
  const r = parseScenario(input);
  if (r.ok) throw new Error("expected problems");
  return r.problems;
};
const problemAt = (input: unknown, path: string) => problemsOf(input).find((p) => p.path === path);

describe("length limits of the scenario format", () => {
  it("the attack of issue 9 (50,000 links, 40,000 survey ranges) is refused by the schema, each list named with its count", () => {
    const s = small((s) => {
      s.deck.lengthFt = 50_000;
      s.deck.packetFt = 10;
      s.links = Array.from({ length: 50_000 }, () => ({ from: "milling", to: "overlay" }));
      s.deck.survey = Array.from({ length: 40_000 }, (_, i) => ({ fromStationFt: i, toStationFt: i + 1, probability: 0.1 }));
    });
    expect(problemAt(s, "links")?.message).toBe("at most 200 links (got 50,000)");
    expect(problemAt(s, "deck.survey")?.message).toBe("at most 500 survey ranges (got 40,000)");
    expect(fieldLabel("definition.deck.survey")).toBe("Deck › Survey ranges");
  });

  it("every list has its limit: one more than the limit is refused, the limit itself passes the length check", () => {
    const cases: [string, (s: ScenarioInput, n: number) => void, number][] = [
      ["deck.lanes", (s, n) => (s.deck.lanes = Array.from({ length: n }, (_, i) => `L${i}`)), LIMITS.lanes],
      ["calendar.shifts", (s, n) => (s.calendar.shifts = Array.from({ length: n }, (_, i) => ({ id: `s${i}`, name: "S", startHour: 7, lengthHours: 8 }))), LIMITS.calendarItems],
      ["calendar.closures", (s, n) => (s.calendar.closures = Array.from({ length: n }, (_, i) => ({ id: `c${i}`, name: "C", lanesClosed: ["L1"] }))), LIMITS.closures],
      ["stages", (s, n) => (s.stages = Array.from({ length: n }, (_, i) => ({ id: `st${i}`, name: "S", lanes: ["L1"] }))), LIMITS.stages],
      ["stages[0].lanes", (s, n) => (s.stages[0].lanes = Array.from({ length: n }, () => "L1")), LIMITS.lanes],
      ["stages[0].standingLanesClosed", (s, n) => (s.stages[0].standingLanesClosed = Array.from({ length: n }, () => "L1")), LIMITS.lanes],
      ["stages[0].operations", (s, n) => (s.stages[0].operations = Array.from({ length: n }, () => "milling")), LIMITS.operations],
      ["calendar.closureWindows", (s, n) => (s.calendar.closureWindows = Array.from({ length: n }, () => ({ closure: "one-lane", dayTypes: ["weekday" as const], startHour: 7, endHour: 17 }))), LIMITS.calendarItems],
      ["calendar.holidays.blackoutDates", (s, n) => (s.calendar.holidays.blackoutDates = Array.from({ length: n }, () => "2027-07-01")), LIMITS.dates],
      ["weather.fixedWetDates", (s, n) => (s.weather.fixedWetDates = Array.from({ length: n }, () => "2027-07-01")), LIMITS.dates],
      ["operations", (s, n) => (s.operations = Array.from({ length: n }, (_, i) => ({ id: `w${i}`, name: "Wait", kind: "wait" as const, durationHours: { type: "fixed" as const, value: 1 } }))), LIMITS.operations],
    ];
    for (const [path, set, limit] of cases) {
      expect(problemAt(small((s) => set(s, limit + 1)), path)?.message, path).toMatch(new RegExp(`^at most ${limit} .* \\(got ${limit + 1}\\)$`));
      const atLimit = parseScenario(small((s) => set(s, limit)));
      const lengthProblem = atLimit.ok ? undefined : atLimit.problems.find((p) => p.path === path && p.message.startsWith("at most"));
      expect(lengthProblem, path).toBeUndefined();
    }
  });

  it("names and descriptions are bounded, in characters, with the count sent", () => {
    expect(problemAt(small((s) => (s.name = "x".repeat(121))), "name")?.message).toBe("must be at most 120 characters (got 121)");
    expect(problemAt(small((s) => (s.description = "x".repeat(2001))), "description")?.message).toBe("must be at most 2,000 characters (got 2,001)");
    expect(problemAt(small((s) => (s.deck.lanes = ["L".repeat(41)])), "deck.lanes[0]")?.message).toMatch(/at most 40 characters/);
  });

  it("the shipped scenarios fit every limit", () => {
    for (const f of ["kestrel-two-season.json", "kestrel-single-season.json", "kestrel-holiday-work.json", "kestrel-two-placement-crews.json", "kestrel-staged-three-lane.json", "small-deterministic.json"]) {
      expect(parseScenario(loadScenario(f)).ok, f).toBe(true);
    }
  });
});

describe("real calendar dates", () => {
  it("isRealIsoDate knows month lengths and leap years", () => {
    expect(isRealIsoDate("2028-02-29")).toBe(true);
    expect(isRealIsoDate("2027-02-29")).toBe(false);
    expect(isRealIsoDate("2027-02-30")).toBe(false);
    expect(isRealIsoDate("2027-13-01")).toBe(false);
    expect(isRealIsoDate("2027-04-31")).toBe(false);
    expect(isRealIsoDate("2027-04-00")).toBe(false);
    expect(isRealIsoDate("2100-02-29")).toBe(false);
    expect(isRealIsoDate("2000-02-29")).toBe(true);
  });

  it("startDate 2027-02-30 is refused in words, and so is every other date field", () => {
    expect(problemAt(small((s) => (s.startDate = "2027-02-30")), "startDate")?.message).toBe("30 Feb 2027 is not a real date");
    expect(problemAt(small((s) => (s.targetDate = "2027-06-31")), "targetDate")?.message).toBe("31 Jun 2027 is not a real date");
    expect(problemAt(small((s) => (s.calendar.holidays.blackoutDates = ["2027-13-01"])), "calendar.holidays.blackoutDates[0]")?.message).toBe("2027-13-01 is not a real date");
    expect(problemAt(small((s) => (s.weather.fixedWetDates = ["2027-02-29"])), "weather.fixedWetDates[0]")?.message).toBe("29 Feb 2027 is not a real date");
  });

  it("the progress and re-forecast requests refuse unreal dates with the field in words", () => {
    const entry = progressEntrySchema.safeParse({ workDate: "2027-02-30", shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 100 });
    expect(entry.success).toBe(false);
    expect(entry.error!.issues.map((i) => i.message)).toContain("Work date: 30 Feb 2027 is not a real date");
    const re = reforecastSchema.safeParse({ dataDate: "2027-11-31", seed: "s", iterations: 100 });
    expect(re.error!.issues[0]).toMatchObject({ path: ["dataDate"], message: "Data date: 31 Nov 2027 is not a real date" });
  });
});

describe("time zone", () => {
  it("only IANA zones the runtime knows are accepted", () => {
    expect(isKnownTimeZone("America/Chicago")).toBe(true);
    expect(isKnownTimeZone("Europe/Berlin")).toBe(true);
    expect(isKnownTimeZone("Mars/Olympus_Mons")).toBe(false);
    expect(isKnownTimeZone("")).toBe(false);
    expect(problemAt(small((s) => (s.timeZone = "Central")), "timeZone")?.message).toBe('"Central" is not an IANA time zone (e.g. America/Chicago)');
  });

  it("a 2,000,000-character zone is refused by its length, without echoing it", () => {
    const p = problemsOf(small((s) => (s.timeZone = "A".repeat(2_000_000))));
    expect(p).toEqual([{ path: "timeZone", message: "must be an IANA time zone such as America/Chicago (got 2,000,000 characters)" }]);
  });
});

describe("control characters", () => {
  it("a NUL in a name, a lane or a closure name is refused with the field's path", () => {
    expect(problemAt(small((s) => (s.name = "Deck\u0000")), "name")?.message).toBe("must not contain control characters (found U+0000)");
    expect(problemAt(small((s) => (s.deck.lanes = ["L\u00001"])), "deck.lanes[0]")?.message).toMatch(/U\+0000/);
    expect(problemAt(small((s) => (s.calendar.closures[0].name = "One\u0007lane")), "calendar.closures[0].name")?.message).toMatch(/U\+0007/);
    expect(problemAt(small((s) => (s.stages[0].name = "Stage\u0000")), "stages[0].name")?.message).toBe("must not contain control characters (found U+0000)");
    expect(problemAt(small((s) => (s.stages[0].name = "x".repeat(121))), "stages[0].name")?.message).toBe("must be at most 120 characters (got 121)");
    expect(problemAt(small((s) => (s.stages[0].standingLanesClosed = ["L\u00001"])), "stages[0].standingLanesClosed[0]")?.message).toMatch(/U\+0000/);
  });

  it("a description may have tabs and new lines but no other control characters", () => {
    expect(parseScenario(small((s) => (s.description = "Line one\r\n\tLine two"))).ok).toBe(true);
    expect(problemAt(small((s) => (s.description = "bell\u0007")), "description")?.message).toBe("must not contain control characters (found U+0007; only tabs and new lines are allowed)");
    expect(problemAt(small((s) => (s.name = "two\nlines")), "name")?.message).toMatch(/U\+000A/);
  });

  it("request schemas refuse control characters in their texts", () => {
    const write = scenarioWriteSchema.safeParse({ name: "A\u0000", definition: {} });
    expect(write.error!.issues[0].path).toEqual(["name"]);
    const entry = progressEntrySchema.safeParse({ workDate: "2027-04-06", shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 100, crew: "Crew\u0000A" });
    expect(entry.error!.issues).toEqual([expect.objectContaining({ path: ["crew"], message: "Crew must not contain control characters (found U+0000)" })]);
  });
});

describe("the run body", () => {
  it("is strict: an unknown top-level field is refused by name", () => {
    const r = runWriteSchema.safeParse({ seed: "s", iterations: 100, internalNotes: "x" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]).toMatchObject({ code: "unrecognized_keys", keys: ["internalNotes"] });
  });
});

describe("field labels", () => {
  it("turn paths into words, items counted from 1", () => {
    expect(fieldLabel("operations[3].closure")).toBe("Operation 4 › Closure");
    expect(fieldLabel("definition.stages[1].standingLanesClosed[0]")).toBe("Stage 2 › Lane behind barrier 1");
    expect(fieldLabel("calendar.closures[0].setupHours")).toBe("Calendar › Closure 1 › Set-up hours");
    expect(fieldLabel("definition.calendar.holidays.blackoutDates[199999]")).toBe("Calendar › Holidays › Blackout date 200000");
    expect(fieldLabel("discovered[0].toStationFt")).toBe("Discovered condition 1 › To station");
    expect(fieldLabel("weather.monthly[1].tmaxMeanF")).toBe("Weather › February › Mean daily high");
    expect(fieldLabel("traffic.directions[0].demand.weekday[7]")).toBe("Traffic › Direction 1 › Demand › Item 8");
    expect(fieldLabel("traffic.basePcPerHourPerLane")).toBe("Traffic › Base pc per hour per lane");
    expect(fieldLabel("(body)")).toBe("Request body");
  });
});
