/**
 * The field-progress rules (`sim/progress-rules.ts`, re-exported by `src/lib/progress-schema.ts`) on the
 * Kestrel demo plan: stations inside the deck, not ahead of the predecessor (with its lag, through a cure), not
 * in the future, discovered items inside the entry; every problem names its field path and the field in words.
 * The seeded demo's field log is checked in tests/unit/demo-job.test.ts.
 */
import { describe, expect, it } from "vitest";
import { parseScenario } from "../../sim/validate";
import { checkDependents, checkProgressEntry, crewPredecessors, progressEntrySchema, todayIn, type RuleEntry } from "../../src/lib/progress-schema";
import { loadScenario } from "./engine-fixtures";

const parsed = parseScenario(loadScenario("kestrel-two-season.json"));
if (!parsed.ok) throw new Error("demo scenario invalid");
const plan = parsed.scenario;
const entry = (over: Record<string, unknown>) =>
  progressEntrySchema.parse({ workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 1600, ...over });
const check = (over: Record<string, unknown>, others: RuleEntry[] = [], today = "2027-05-01") => checkProgressEntry({ scenario: plan, entry: entry(over), others, today });
const setupDone: RuleEntry = { id: "a", workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 2000 };

describe("progress entry rules", () => {
  it("accepts an entry inside the deck with nothing before it", () => {
    expect(check({})).toEqual([]);
  });

  it("stations outside the deck name the field", () => {
    const p = check({ fromStationFt: 1100, toStationFt: 9700 });
    expect(p.map((x) => x.path)).toEqual(["fromStationFt", "toStationFt"]);
    expect(p[0].message).toMatch(/^From station must be inside the deck \(STA 12\+00 to STA 96\+00\)/);
  });

  it("from must be before to (schema, with the path of the later field)", () => {
    const r = progressEntrySchema.safeParse({ workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: 1500, toStationFt: 1500 });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => [i.path.join("."), i.message])).toEqual([["toStationFt", "To station must be after the from station"]]);
  });

  it("dates after today or before the plan's start are refused", () => {
    expect(check({ workDate: "2027-05-02" })).toEqual([{ path: "workDate", message: "Work date must not be in the future (today is 2027-05-01)" }]);
    expect(check({ workDate: "2027-04-04" })[0]).toEqual({ path: "workDate", message: "Work date must not be before the plan starts (2027-04-05)" });
  });

  it("a wait operation or an unknown one cannot be recorded", () => {
    expect(check({ operationId: "cure" })[0].path).toBe("operationId");
    expect(check({ operationId: "nothing" })[0].message).toBe('Operation "nothing" is not in this plan');
  });

  it("an operation cannot be ahead of its predecessor at the same stations, lag included", () => {
    // Milling must stay 200 ft behind setup: setup to STA 20+00 allows milling to STA 18+00, not 18+50.
    expect(check({ operationId: "milling", toStationFt: 1800 }, [setupDone])).toEqual([]);
    const p = check({ operationId: "milling", toStationFt: 1850 }, [setupDone]);
    expect(p).toHaveLength(1);
    expect(p[0].path).toBe("toStationFt");
    expect(p[0].message).toBe("Mechanical milling cannot be recorded ahead of Work-zone setup: Work-zone setup has no progress recorded by this shift at STA 20+00 (it must stay 200 ft ahead)");
    // Predecessor progress from a later shift does not count.
    expect(check({ operationId: "milling", workDate: "2027-04-05", toStationFt: 1300 }, [setupDone])[0].path).toBe("fromStationFt");
  });

  it("restriping looks through the cure to placement", () => {
    expect(crewPredecessors(plan, "restriping")).toEqual([{ id: "placement", lagFt: 0 }]);
    expect(check({ operationId: "restriping" })[0].message).toMatch(/ahead of LMC placement/);
  });

  it("discovered conditions must lie inside the entry's range", () => {
    const p = check({ discovered: [{ kind: "full-depth", fromStationFt: 1500, toStationFt: 1700, areaSqFt: 20 }] });
    expect(p).toEqual([{ path: "discovered[0].toStationFt", message: "Condition to station must be inside this shift's range (STA 12+00 to STA 16+00)" }]);
  });

  it("an edit that leaves a later operation ahead is reported", () => {
    const milling: RuleEntry = { id: "m", workDate: "2027-04-06", shift: "night", operationId: "milling", fromStationFt: 1200, toStationFt: 1700 };
    const before = [setupDone, milling];
    const after = [{ ...setupDone, toStationFt: 1500 }, milling];
    expect(checkDependents(plan, before, after).map((p) => p.path)).toEqual(["(entry)"]);
    expect(checkDependents(plan, before, before)).toEqual([]);
  });

  it("today is the date in the scenario's time zone", () => {
    const now = new Date("2026-12-02T03:30:00Z"); // 21:30 on 1 Dec in Chicago (UTC−6)
    expect(todayIn("America/Chicago", now)).toBe("2026-12-01");
    expect(todayIn("UTC", now)).toBe("2026-12-02");
  });
});

describe("stations as people type them", () => {
  it("accepts feet or 12+50 and refuses letters instead of dropping them", () => {
    expect(progressEntrySchema.parse({ workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: "12+00", toStationFt: "STA 16+50.5" })).toMatchObject({ fromStationFt: 1200, toStationFt: 1650.5 });
    expect(progressEntrySchema.parse({ workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: "1,200", toStationFt: 1600 }).fromStationFt).toBe(1200);
    const bad = progressEntrySchema.safeParse({ workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: "12a0", toStationFt: 1600 });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({ path: ["fromStationFt"], message: "From station must be in feet (1250) or a station (12+50); “12a0” is neither" });
  });
});

describe("a stretch is recorded once per operation", () => {
  it("refuses setup over STA 15+00–16+00 again, names the earlier entry, and lets an edit of that entry through", () => {
    const p = check({ fromStationFt: 1500, toStationFt: 1700 }, [setupDone]);
    expect(p).toEqual([{ path: "fromStationFt", message: expect.stringMatching(/^Work-zone setup is already recorded over STA 12\+00–STA 20\+00 \(2027-04-06, night shift\)/) }]);
    // Touching end to end is not an overlap; editing the entry itself is not a second record.
    expect(check({ fromStationFt: 2000, toStationFt: 2300 }, [setupDone])).toEqual([]);
    expect(checkProgressEntry({ scenario: plan, entry: entry({ fromStationFt: 1200, toStationFt: 2100 }), others: [setupDone], today: "2027-05-01", id: "a" })).toEqual([]);
  });
});
