import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { countText, formatClockOnDay, formatDateTime, formatDateTimeIn, formatIsoClock, formatIsoDate, formatIsoDay } from "@/lib/format";

// Weekdays checked against a printed calendar of 2026–2027 (3 Dec 2026 is a Thursday; 5 Apr 2027 a Monday).
describe("date words on the week-ahead board and its e-mail", () => {
  it("names the weekday, the day and the month, with or without the year", () => {
    expect(formatIsoDay("2026-12-03")).toBe("Thu 3 Dec 2026");
    expect(formatIsoDay("2026-12-03", { long: true })).toBe("Thursday 3 Dec 2026");
    expect(formatIsoDay("2027-04-05", { year: false })).toBe("Mon 5 Apr");
    expect(formatIsoDay("2027-04-05T09:30")).toBe("Mon 5 Apr 2027");
  });

  it("reads a clock time where the work is, without shifting it through any time zone", () => {
    expect(formatIsoClock("2026-12-03T06:00")).toBe("3 Dec 2026 06:00");
    expect(formatIsoClock("2027-03-14T02:00", { year: false })).toBe("14 Mar 02:00"); // a US spring-forward night
  });

  it("a queue's clearing time beside its day: the clock alone on that day, with the date past midnight", () => {
    expect(formatClockOnDay("2026-05-22T14:35", "2026-05-22")).toBe("14:35");
    expect(formatClockOnDay("2026-05-23T02:10", "2026-05-22")).toBe("23 May 02:10");
    expect(formatClockOnDay(null, "2026-05-22")).toBe("—");
  });

  it("a moment as the clock reads where the work is, whatever zone the process runs in", () => {
    // US Central time is UTC−6 in winter and UTC−5 in summer (the IANA time zone database, America/Chicago).
    expect(formatDateTimeIn(new Date("2026-12-05T01:40:00Z"), "America/Chicago")).toBe("4 Dec 2026, 19:40");
    expect(formatDateTimeIn("2027-07-01T12:05:00Z", "America/Chicago")).toBe("1 Jul 2027, 07:05");
    expect(formatDateTimeIn(new Date("2026-12-05T00:00:00Z"), "UTC")).toBe("5 Dec 2026, 00:00"); // midnight is 00, not 24
    expect(formatDateTimeIn("not a date", "UTC")).toBe("not a date");
  });

  it("every moment is shown in the installation's zone (POURLINE_TIME_ZONE), else the process's own", () => {
    const before = process.env.POURLINE_TIME_ZONE;
    const moment = new Date("2026-12-05T01:40:00Z");
    try {
      process.env.POURLINE_TIME_ZONE = "America/Chicago";
      expect(formatDateTime(moment)).toBe("4 Dec 2026, 19:40");
      process.env.POURLINE_TIME_ZONE = "Asia/Tokyo"; // UTC+9, no daylight saving (IANA time zone database)
      expect(formatDateTime(moment)).toBe("5 Dec 2026, 10:40");
      delete process.env.POURLINE_TIME_ZONE;
      expect(formatDateTime(moment)).toBe(formatDateTimeIn(moment, Intl.DateTimeFormat().resolvedOptions().timeZone));
    } finally {
      if (before === undefined) delete process.env.POURLINE_TIME_ZONE;
      else process.env.POURLINE_TIME_ZONE = before;
    }
  });

  it("gives back what it cannot read instead of a wrong date", () => {
    expect(formatIsoDay("not a date")).toBe("not a date");
    expect(formatIsoClock("")).toBe("");
  });

  it("agrees with the long-form date for every day of 1990–2100", () => {
    fc.assert(
      fc.property(fc.date({ min: new Date(Date.UTC(1990, 0, 1)), max: new Date(Date.UTC(2100, 11, 31)), noInvalidDate: true }), (d) => {
        const iso = d.toISOString().slice(0, 10);
        expect(formatIsoDay(iso)).toMatch(/^(Mon|Tue|Wed|Thu|Fri|Sat|Sun) /);
        expect(formatIsoDay(iso).slice(4)).toBe(formatIsoDate(iso));
        const weekday = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"][new Date(`${iso}T12:00:00Z`).getUTCDay()];
        expect(formatIsoDay(iso).slice(0, 3)).toBe(weekday);
      }),
    );
  });
});

describe("a count with its noun", () => {
  it("is singular only for exactly one, with thousands grouped", () => {
    expect([countText(0, "shift"), countText(1, "shift"), countText(2000, "shift"), countText(1, "discovered condition"), countText(3, "day", "days")]).toEqual([
      "0 shifts",
      "1 shift",
      "2,000 shifts",
      "1 discovered condition",
      "3 days",
    ]);
  });
});
