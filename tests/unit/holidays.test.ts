import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { federalHolidays, observedFederalHolidayDays } from "../../sim/holidays";
import { parseIsoDate } from "../../sim/dates";

// Weekdays here come from the JavaScript Date object, independently of sim/dates.
const weekday = (iso: string) => new Date(`${iso}T00:00:00Z`).getUTCDay();
const byName = (year: number, fragment: string) => {
  const h = federalHolidays(year).find((x) => x.name.startsWith(fragment));
  if (!h) throw new Error(`${fragment} missing in ${year}`);
  return h;
};

describe("published and computed dates", () => {
  it("2008 Monday and Thursday holidays", () => {
    // Source: OPM federal holiday schedule for 2008 (SOURCES.md, "Federal holidays", found).
    expect(byName(2008, "Birthday of Martin").date).toBe("2008-01-21");
    expect(byName(2008, "Washington").date).toBe("2008-02-18");
    expect(byName(2008, "Memorial").date).toBe("2008-05-26");
    expect(byName(2008, "Labor").date).toBe("2008-09-01");
    expect(byName(2008, "Columbus").date).toBe("2008-10-13");
    expect(byName(2008, "Thanksgiving").date).toBe("2008-11-27");
  });

  it("2009: Independence Day observed Friday 3 July; Thanksgiving 26 November", () => {
    // Source: OPM federal holiday schedule for 2009 (SOURCES.md, found).
    const july4 = byName(2009, "Independence");
    expect(july4.date).toBe("2009-07-04");
    expect(july4.observed).toBe("2009-07-03");
    expect(byName(2009, "Thanksgiving").observed).toBe("2009-11-26");
  });

  it("2026 and 2027 computed dates", () => {
    // Source: SOURCES.md, computed from the 5 U.S.C. 6103 rules (4 Jul 2026 is a Saturday; 19 Jun 2027 a
    // Saturday, 4 Jul 2027 a Sunday, 25 Dec 2027 a Saturday).
    expect(byName(2026, "Thanksgiving").date).toBe("2026-11-26");
    expect(byName(2026, "Independence").observed).toBe("2026-07-03");
    expect(byName(2027, "Juneteenth").observed).toBe("2027-06-18");
    expect(byName(2027, "Independence").observed).toBe("2027-07-05");
    expect(byName(2027, "Christmas").observed).toBe("2027-12-24");
  });

  it("1 Jan 2022 (a Saturday) is observed on 31 Dec 2021, and the day set of 2021 includes it", () => {
    // Source: computed from the Saturday rule of 5 U.S.C. 6103(b); 2022-01-01 is a Saturday.
    expect(weekday("2022-01-01")).toBe(6);
    expect(byName(2022, "New Year").observed).toBe("2021-12-31");
    const days2021 = observedFederalHolidayDays(2021, 2021);
    expect(days2021.has(parseIsoDate("2021-12-31"))).toBe(true);
    expect(observedFederalHolidayDays(2022, 2022).has(parseIsoDate("2021-12-31"))).toBe(false);
    expect(days2021.size).toBe(12); // 11 holidays of 2021 plus New Year's Day 2022 observed in 2021
  });

  it("Juneteenth is absent before 2021 and present from 2021", () => {
    // Source: Juneteenth National Independence Day Act, Pub. L. 117-17 (2021), adding 19 June to 6103(a).
    for (let y = 1990; y < 2021; y++) expect(federalHolidays(y).some((h) => h.name.includes("Juneteenth"))).toBe(false);
    for (let y = 2021; y < 2060; y++) expect(byName(y, "Juneteenth").date).toBe(`${y}-06-19`);
    expect(federalHolidays(2020)).toHaveLength(10);
    expect(federalHolidays(2021)).toHaveLength(11);
  });
});

describe("rules as properties, years 1900–2200", () => {
  const year = fc.integer({ min: 1900, max: 2200 });
  const mondays: Array<[string, number, number, number]> = [
    // [name fragment, month, first possible day, last possible day] — Source: 5 U.S.C. 6103(a).
    ["Washington", 2, 15, 21], // third Monday
    ["Memorial", 5, 25, 31], // last Monday
    ["Labor", 9, 1, 7], // first Monday
    ["Columbus", 10, 8, 14], // second Monday
  ];

  it("Thanksgiving is a Thursday between 22 and 28 November", () => {
    fc.assert(
      fc.property(year, (y) => {
        const d = byName(y, "Thanksgiving").date;
        expect(weekday(d)).toBe(4);
        expect(d.slice(5, 7)).toBe("11");
        const day = Number(d.slice(8));
        expect(day).toBeGreaterThanOrEqual(22);
        expect(day).toBeLessThanOrEqual(28);
      }),
    );
  });

  it("Monday holidays land on a Monday in the right week", () => {
    fc.assert(
      fc.property(year, (y) => {
        for (const [name, month, lo, hi] of mondays) {
          const d = byName(y, name).date;
          expect(weekday(d)).toBe(1);
          expect(Number(d.slice(5, 7))).toBe(month);
          expect(Number(d.slice(8))).toBeGreaterThanOrEqual(lo);
          expect(Number(d.slice(8))).toBeLessThanOrEqual(hi);
        }
        if (y >= 1986) {
          const mlk = byName(y, "Birthday of Martin").date; // third Monday of January
          expect(weekday(mlk)).toBe(1);
          expect(mlk.slice(5, 7)).toBe("01");
          expect(Number(mlk.slice(8))).toBeGreaterThanOrEqual(15);
          expect(Number(mlk.slice(8))).toBeLessThanOrEqual(21);
        }
      }),
    );
  });

  it("observed is never a weekend and is the date itself or the Friday before / Monday after", () => {
    fc.assert(
      fc.property(year, (y) => {
        for (const h of federalHolidays(y)) {
          const wd = weekday(h.date);
          const obs = weekday(h.observed);
          expect(obs).not.toBe(0);
          expect(obs).not.toBe(6);
          const shift = parseIsoDate(h.observed) - parseIsoDate(h.date);
          expect(shift).toBe(wd === 6 ? -1 : wd === 0 ? 1 : 0);
        }
      }),
    );
  });

  it("fixed-date holidays keep their dates, in date order", () => {
    fc.assert(
      fc.property(year, (y) => {
        const hs = federalHolidays(y);
        expect(byName(y, "New Year").date).toBe(`${y}-01-01`);
        expect(byName(y, "Independence").date).toBe(`${y}-07-04`);
        expect(byName(y, "Veterans").date).toBe(`${y}-11-11`);
        expect(byName(y, "Christmas").date).toBe(`${y}-12-25`);
        for (let i = 1; i < hs.length; i++) expect(hs[i].date > hs[i - 1].date).toBe(true);
      }),
    );
  });
});
