import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { daysOfWeek, weekDayLines, weeklyDueDay, weeklySettingText, weekSummary } from "@/lib/closure-weekly";
import { localDateHour } from "@/lib/local-clock";
import type { AdvisoryDay } from "@/lib/advisory";
import { parseIsoDate, weekdayOfDayNumber } from "@sim/dates";
import { closureWeeklyMail } from "@/lib/server/mail/closure-weekly-mail";

// Weekdays checked against a printed calendar: 4 Dec 2026 is a Friday, 5 Dec a Saturday.
describe("when the weekly closure e-mail is due", () => {
  const friday = 5;
  it("on its weekday where the work is, at or after its hour, once", () => {
    // 23:30 UTC on Friday 4 Dec is 17:30 that Friday in Chicago (UTC−6 in December, IANA time zone database) …
    const now = new Date("2026-12-04T23:30:00Z");
    expect(weeklyDueDay({ now, timeZone: "America/Chicago", weekday: friday, hour: 17, lastOn: null })).toBe("2026-12-04");
    expect(weeklyDueDay({ now, timeZone: "America/Chicago", weekday: friday, hour: 18, lastOn: null })).toBeNull(); // not yet 18:00
    expect(weeklyDueDay({ now, timeZone: "America/Chicago", weekday: friday, hour: 7, lastOn: "2026-12-04" })).toBeNull(); // done that day
    expect(weeklyDueDay({ now, timeZone: "America/Chicago", weekday: friday, hour: 7, lastOn: "2026-11-27" })).toBe("2026-12-04");
    // … and 08:30 on Saturday 5 Dec in Tokyo (UTC+9): not Friday there.
    expect(weeklyDueDay({ now, timeZone: "Asia/Tokyo", weekday: friday, hour: 7, lastOn: null })).toBeNull();
    expect(weeklyDueDay({ now, timeZone: "Asia/Tokyo", weekday: 6, hour: 7, lastOn: null })).toBe("2026-12-05");
  });

  it("only ever on the chosen weekday, after the chosen hour, and never for a day already done", () => {
    fc.assert(
      fc.property(fc.date({ min: new Date("2020-01-01"), max: new Date("2035-12-31"), noInvalidDate: true }), fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 23 }), (now, weekday, hour) => {
        const due = weeklyDueDay({ now, timeZone: "America/Chicago", weekday, hour, lastOn: null });
        const local = localDateHour(now, "America/Chicago");
        if (due === null) {
          expect(weekdayOfDayNumber(parseIsoDate(local.date)) !== weekday || local.hour < hour).toBe(true);
          return;
        }
        expect(due).toBe(local.date);
        expect(weekdayOfDayNumber(parseIsoDate(due))).toBe(weekday);
        expect(local.hour).toBeGreaterThanOrEqual(hour);
        expect(weeklyDueDay({ now, timeZone: "America/Chicago", weekday, hour, lastOn: due })).toBeNull();
      }),
    );
  });

  it("says the setting in words", () => {
    expect(weeklySettingText(4, 7)).toBe("Weekly on Thursday after 07:00");
    expect(weeklySettingText(0, 18)).toBe("Weekly on Sunday after 18:00");
  });
});

const day = (date: string, closures: AdvisoryDay["closures"], extra: Partial<AdvisoryDay> = {}): AdvisoryDay => ({
  date,
  weekday: "",
  holidayWeekend: false,
  closures,
  longestBackupMiles: 0,
  longestDelayMinutes: 0,
  overLimit: false,
  avoid: [],
  ...extra,
});
const night = { name: "Night two-lane closure", lanes: ["L2", "L3"], standing: false, from: "21:00", to: "24:00" };

describe("the week in words", () => {
  it("keeps the seven days from the day it goes out", () => {
    const days = [day("2026-12-04", [night]), day("2026-12-10", [night]), day("2026-12-11", [night])];
    expect(daysOfWeek(days, "2026-12-04").map((d) => d.date)).toEqual(["2026-12-04", "2026-12-10"]);
    expect(weekSummary(daysOfWeek(days, "2026-12-04"), "2026-12-04")).toBe("2 days with closures from Fri 4 Dec 2026 to Thu 10 Dec 2026");
    expect(weekSummary([], "2026-12-04")).toBe("no day with closures from Fri 4 Dec 2026 to Thu 10 Dec 2026");
  });

  it("each day: its closures with hours and lanes, then the backup and the hours to avoid", () => {
    expect(weekDayLines(day("2026-12-04", [night], { longestBackupMiles: 1.24, avoid: ["15:00–18:00"], holidayWeekend: true }))).toEqual([
      "Fri 4 Dec 2026 (holiday weekend)",
      "  21:00–24:00  Night two-lane closure (L2, L3 closed)",
      "  Expected longest backup 1.2 mi; avoid 15:00–18:00 if you can.",
    ]);
    expect(weekDayLines(day("2026-12-05", [{ ...night, name: "Stage 1 barrier", standing: true, from: "00:00" }]))).toEqual([
      "Sat 5 Dec 2026",
      "  00:00–24:00  Stage 1 barrier (L2, L3 closed, round the clock)",
      "  No significant backup expected.",
    ]);
  });

  it("the e-mail: the week, the days, where to follow changes — and what people typed escaped in its HTML", () => {
    const mail = closureWeeklyMail({
      to: "pio@county.example",
      structure: "Causeway <east>",
      projectName: "Deck & approach",
      timeZone: "America/Chicago",
      day: "2026-12-04",
      days: [day("2026-12-04", [night])],
      publishedAt: new Date("2026-12-02T15:00:00Z"),
    });
    expect(mail.subject).toBe("Lane closures in the week ahead: Causeway <east>, from Fri 4 Dec 2026");
    expect(mail.text).toContain("Planned lane closures on Causeway <east> in the week ahead: 1 day with closures from Fri 4 Dec 2026 to Thu 10 Dec 2026, from the closure plan published 2 Dec 2026, 09:00.");
    expect(mail.text).toContain("\nFri 4 Dec 2026\n  21:00–24:00  Night two-lane closure (L2, L3 closed)\n  No significant backup expected.\n");
    expect(mail.text).toContain('the "Deck & approach" team lists you for closure notices');
    expect(mail.html).toContain("Causeway &lt;east&gt;");
    expect(mail.html).not.toContain("<east>");
  });
});
