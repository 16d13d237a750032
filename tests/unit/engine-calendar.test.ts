import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compileCalendar, firstIntervalAfter, nextIntervalAfter, type Intervals } from "../../sim/calendar";
import { formatHours, parseIsoDate } from "../../sim/dates";
import type { CrewOperation, Scenario, ScenarioInput } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { small } from "./engine-fixtures";

function compiled(patch: Parameters<typeof small>[0]) {
  const r = parseScenario(small(patch));
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return { s: r.scenario as Scenario, cal: compileCalendar(r.scenario) };
}
/** Open intervals of operation 0 between two dates, as local date-times. */
function openBetween(c: ReturnType<typeof compiled>, from: string, to: string): string[] {
  const day0 = c.cal.startDay;
  const lo = 24 * (parseIsoDate(from) - day0);
  const hi = 24 * (parseIsoDate(to) - day0);
  const iv = c.cal.ops[0]!.open;
  const out: string[] = [];
  for (let i = 0; i < iv.length; i++)
    if (iv.starts[i] >= lo && iv.starts[i] < hi) out.push(`${formatHours(day0, iv.starts[i])}/${formatHours(day0, iv.ends[i]).slice(11)}`);
  return out;
}

describe("compileCalendar", () => {
  it("blocks the Independence Day weekend from 15:00 the day before (5 U.S.C. 6103: 4 Jul 2027 is a Sunday, observed Mon 5 Jul)", () => {
    // Source for the observed date: 5 U.S.C. 6103(b) (Sunday → Monday); SOURCES.md lists 2027-07-05.
    const c = compiled((s) => {
      s.startDate = "2027-06-28";
    });
    expect(openBetween(c, "2027-07-01", "2027-07-08")).toEqual([
      "2027-07-01T07:00/17:00",
      "2027-07-02T07:00/15:00", // block Sat 3 – Mon 5 starts Fri 2 at 15:00
      "2027-07-06T07:00/17:00",
      "2027-07-07T07:00/17:00",
    ]);
    expect(c.cal.dayType[parseIsoDate("2027-07-05") - c.cal.startDay]).toBe(3);
  });

  it("extends a Thursday holiday over Friday and the weekend; workThrough blocks nothing", () => {
    const c = compiled((s) => {
      s.startDate = "2027-11-15";
      s.calendar.season.winterStart = "12-20";
    });
    // Thanksgiving 2027 is Thu 25 Nov: blocked Wed 24 15:00 → Mon 29 00:00.
    expect(openBetween(c, "2027-11-24", "2027-11-30")).toEqual(["2027-11-24T07:00/15:00", "2027-11-29T07:00/17:00"]);
    const w = compiled((s) => {
      s.startDate = "2027-11-15";
      s.calendar.season.winterStart = "12-20";
      s.calendar.holidays.policy = "workThrough";
      s.calendar.closureWindows[0].dayTypes = ["weekday", "holiday"];
    });
    expect(openBetween(w, "2027-11-24", "2027-11-27")).toEqual([
      "2027-11-24T07:00/17:00",
      "2027-11-25T07:00/17:00",
      "2027-11-26T07:00/17:00",
    ]);
  });

  it("uses holiday windows only on holidays (the closure has no weekday window that day)", () => {
    const c = compiled((s) => {
      s.startDate = "2027-11-15";
      s.calendar.season.winterStart = "12-20";
      s.calendar.holidays.policy = "workThrough";
    });
    // Thu 25 Nov is a holiday, so the weekday window does not apply: no work that day.
    expect(openBetween(c, "2027-11-25", "2027-11-27")).toEqual(["2027-11-26T07:00/17:00"]);
  });

  it("runs a night shift over midnight inside an overnight window, by the day each starts", () => {
    const c = compiled((s) => {
      s.startDate = "2027-04-05"; // Monday
      s.calendar.shifts = [{ id: "night", name: "Night", startHour: 20, lengthHours: 10 }];
      s.calendar.workDays = [1, 2, 3, 4, 5];
      s.calendar.closureWindows = [{ closure: "one-lane", dayTypes: ["weekday"], startHour: 21, endHour: 5 }];
      for (const o of s.operations) (o as CrewOperation).shifts = ["night"];
    });
    expect(openBetween(c, "2027-04-09", "2027-04-13")).toEqual([
      "2027-04-09T21:00/05:00", // Friday's shift and Friday's window run into Saturday
      "2027-04-12T21:00/05:00",
    ]);
    expect(c.cal.ops[0]!.open.starts[0]).toBe(21);
  });

  it("does not work a night shift that began in a stand-down or a winter, even after the block ends", () => {
    // MODEL.md condition 3 (common practice, no published source): Memorial Day 2027 is Mon 31 May (5 U.S.C.
    // 6103: last Monday of May), so the block runs Fri 28 May 15:00 → Tue 1 Jun 00:00. Monday night's shift
    // starts 21:00 inside it: not worked, not even Tuesday 00:00–05:00. Tuesday night's is the first back.
    const night = (s: ScenarioInput) => {
      s.calendar.shifts = [{ id: "night", name: "Night", startHour: 21, lengthHours: 8 }];
      s.calendar.workDays = [0, 1, 2, 3, 4, 5, 6];
      s.calendar.closureWindows = [{ closure: "one-lane", dayTypes: ["weekday", "saturday", "sunday", "holiday"], startHour: 21, endHour: 5 }];
      for (const o of s.operations) (o as CrewOperation).shifts = ["night"];
    };
    const c = compiled((s) => {
      s.startDate = "2027-05-24";
      night(s);
    });
    expect(openBetween(c, "2027-05-27", "2027-06-03")).toEqual([
      "2027-05-27T21:00/05:00", // Thursday night, before the block
      "2027-06-01T21:00/05:00", // Tuesday night: nothing on Tuesday 00:00–05:00
      "2027-06-02T21:00/05:00",
    ]);
    // The same at a winter's end (31 Mar 00:00): the night of 30 Mar began in the winter.
    const w = compiled((s) => {
      s.startDate = "2027-11-22";
      s.calendar.holidays.policy = "workThrough";
      s.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-31", demobilizeHours: 0 };
      night(s);
    });
    expect(openBetween(w, "2028-03-30", "2028-04-02")).toEqual(["2028-03-31T21:00/05:00", "2028-04-01T21:00/05:00"]);
    // A shift that starts before a block is still worked up to the block's start (Tue 30 Nov night → Wed 00:00).
    expect(openBetween(w, "2027-11-30", "2027-12-01")).toEqual(["2027-11-30T21:00/00:00"]);
  });

  it("blocks winter and the demobilization hours before it; a cut-off date moves the first winter", () => {
    const c = compiled((s) => {
      s.startDate = "2027-11-22";
      s.calendar.holidays.policy = "workThrough";
      s.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-15", demobilizeHours: 10 };
    });
    // Winter from Wed 1 Dec 00:00; 10 h before → Tue 30 Nov 14:00.
    expect(openBetween(c, "2027-11-30", "2028-03-16")).toEqual(["2027-11-30T07:00/14:00", "2028-03-15T07:00/17:00"]);
    expect(formatHours(c.cal.startDay, c.cal.firstWinterEnd)).toBe("2028-03-15T00:00");
    const two = compiled((s) => {
      s.startDate = "2027-11-01";
      s.calendar.season = { plan: "two", winterStart: "12-01", winterEnd: "03-15", cutoffDate: "2027-11-10" };
    });
    expect(formatHours(two.cal.startDay, two.cal.firstWinterStart)).toBe("2027-11-10T00:00");
    expect(openBetween(two, "2027-11-09", "2028-03-16")).toEqual(["2027-11-09T07:00/17:00", "2028-03-15T07:00/17:00"]);
  });
});

describe("nextIntervalAfter (the forward scan of closure use and working days)", () => {
  // Reference: the first interval whose end is after t, by walking every interval from the start.
  const walk = (iv: Intervals, t: number) => {
    let i = 0;
    while (i < iv.length && iv.ends[i] <= t) i++;
    return i;
  };
  it("gives what a look-up from scratch gives, from any earlier answer, across winters, holidays and past the horizon", () => {
    const c = compiled((s) => {
      s.calendar.season = { ...s.calendar.season, plan: "single" };
    });
    const lists: Intervals[] = [c.cal.ops[0]!.open, ...c.cal.closureWindows];
    const horizon = c.cal.horizonHours;
    expect(lists.every((iv) => iv.length > 100)).toBe(true);
    fc.assert(
      fc.property(fc.nat(lists.length - 1), fc.double({ min: -48, max: horizon + 48, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true }), (k, t1, step) => {
        const iv = lists[k];
        const t2 = t1 + step;
        const from = firstIntervalAfter(iv, t1);
        expect(from).toBe(walk(iv, t1));
        expect(nextIntervalAfter(iv, from, t2)).toBe(walk(iv, t2));
      }),
      { numRuns: 2000 },
    );
  });
});
