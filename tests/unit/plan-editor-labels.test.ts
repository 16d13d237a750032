// Problem paths in words: the editor's error summary names the section, the row and the field's label.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseScenario } from "@sim/validate";
import { describeProblemPath, plainMessage } from "@/components/plan-editor/problem-labels";

const plan = JSON.parse(readFileSync(new URL("../../scenarios/kestrel-two-season.json", import.meta.url), "utf8"));
const placement = plan.operations.findIndex((o: { id: string }) => o.id === "placement");

describe("describeProblemPath", () => {
  it("names an operation's field by the operation's name, its section and the label", () => {
    expect(describeProblemPath(`operations[${placement}].rate.dist.min`, plan)).toEqual({
      section: "crews",
      sectionLabel: "Crews and rates",
      field: "LMC placement — production rate, lowest",
    });
    expect(describeProblemPath(`definition.operations[${placement}].gates.minTempF`, plan).field).toBe("LMC placement — minimum temperature (°F)");
    expect(describeProblemPath(`operations[${placement}].shifts[0]`, plan).field).toBe("LMC placement — shift 1");
  });
  it("names season fields by their label, not their path", () => {
    expect(describeProblemPath("calendar.season.winterStart", plan)).toEqual({ section: "calendar", sectionLabel: "Calendar and closures", field: "Winter starts (MM-DD)" });
    expect(describeProblemPath("targetDate", plan).field).toBe("Target date");
  });
  it("names rows of lists: shifts and closures by name, months by name, links by their ends", () => {
    expect(describeProblemPath("calendar.shifts[0].lengthHours", plan).field).toBe("Shift “Day shift” — length (h)");
    expect(describeProblemPath("weather.monthly[6].tminMeanF", plan).field).toBe("July — mean low (°F)");
    expect(describeProblemPath("links[0].lagFt", plan).field).toBe("Link Work-zone setup → Mechanical milling — lag (ft)");
    expect(describeProblemPath("links[0]", plan).field).toBe("Link Work-zone setup → Mechanical milling");
  });
  it("falls back to words for a key it does not list, and to a row number for a row with no name", () => {
    expect(describeProblemPath("calendar.season.someNewSetting", plan).field).toBe("Some new setting");
    expect(describeProblemPath("operations[0].name", { operations: [{ name: "" }] }).field).toBe("Operation 1 — name");
  });
  it("rewrites paths and keys quoted inside a message", () => {
    expect(plainMessage("must come before winterStart in the year", plan)).toBe("must come before winter starts (MM-DD) in the year");
    expect(plainMessage("closes every lane (calendar.closures[0])", plan)).toBe("closes every lane (Closure “Day single-lane closure”)");
  });
  it("leaves no path in what people read, for every problem the engine reports on a broken plan", () => {
    // One plan the schema refuses, one it accepts but the meaning checks refuse (they run only after the schema).
    const badShape = structuredClone(plan);
    badShape.operations[placement].rate.dist = { type: "triangular", min: 5, mode: 3, max: -1 };
    badShape.weather.monthly[2].tminMeanF = 200;
    const badMeaning = structuredClone(plan);
    badMeaning.calendar.season.winterStart = "02-30";
    badMeaning.operations[1].shifts = ["ghost"];
    badMeaning.links[0].lagFt = 1e9;
    badMeaning.targetDate = "2020-01-01";
    for (const broken of [badShape, badMeaning]) {
      const parsed = parseScenario(broken);
      expect(parsed.ok).toBe(false);
      if (parsed.ok) return;
      expect(parsed.problems.length).toBeGreaterThanOrEqual(3);
      for (const p of parsed.problems) {
        const text = `${describeProblemPath(p.path, broken).field} ${plainMessage(p.message, broken)}`;
        expect(text, p.path).not.toMatch(/\[\d+\]|[a-z]\.[a-z]|[a-z][A-Z]/);
      }
    }
  });
});

describe("plainMessage on the schema's own wording", () => {
  it("says a blank or unreadable number must be a number, and limits as ≤ / ≥", () => {
    expect(plainMessage("Invalid input: expected number, received NaN", plan)).toBe("must be a number");
    expect(plainMessage("Too big: expected number to be <=130", plan)).toBe("must be ≤ 130");
  });
});
