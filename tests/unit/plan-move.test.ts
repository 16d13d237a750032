/**
 * How far the plan of record's P80 finish moved between two forecasts, in words: calendar days, checked against
 * plain day counting from the Unix epoch (a reference of our own, independent of date-fns) for any two dates
 * 1990–2100; a time of day after the date does not count.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { p80MoveText } from "../../src/components/plan-of-record-headline";

const dayNumber = (iso: string) => Date.UTC(Number(iso.slice(0, 4)), Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10))) / 86_400_000;
const isoOf = (n: number) => new Date(n * 86_400_000).toISOString().slice(0, 10);

describe("p80MoveText", () => {
  it("says later, earlier or unchanged by the calendar days between the dates", () => {
    const days = fc.integer({ min: dayNumber("1990-01-01"), max: dayNumber("2100-12-31") });
    fc.assert(
      fc.property(days, days, (a, b) => {
        const text = p80MoveText(isoOf(a), isoOf(b));
        const n = Math.abs(a - b);
        const unit = n === 1 ? "day" : "days";
        if (a === b) expect(text).toBe("unchanged since the previous forecast");
        else expect(text).toBe(`${n.toLocaleString("en-US")} ${unit} ${a > b ? "later" : "earlier"} than the previous forecast`);
      }),
    );
  });

  it("counts whole days and ignores a time of day", () => {
    expect(p80MoveText("2027-03-15", "2027-03-13")).toBe("2 days later than the previous forecast");
    expect(p80MoveText("2027-11-06T07:00", "2027-11-08T17:00")).toBe("2 days earlier than the previous forecast");
    expect(p80MoveText("2027-08-24", "2027-08-23")).toBe("1 day later than the previous forecast");
  });

  it("says nothing without both dates", () => {
    expect(p80MoveText(undefined, "2027-08-23")).toBeNull();
    expect(p80MoveText("2027-08-23", undefined)).toBeNull();
    expect(p80MoveText("not a date", "2027-08-23")).toBeNull();
  });
});
