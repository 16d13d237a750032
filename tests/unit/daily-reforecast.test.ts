/**
 * When the daily re-forecast is due (src/lib/daily-reforecast.ts): the local day and hour where the work is, once a
 * day, from the day before, and only when the newest re-forecast is behind. The rule is ours (common practice, no
 * published source: a look-ahead is refreshed each morning from the last complete day of field records).
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { dailyDecision, dayToConsider, QUIET_DAYS, type NewestReforecast } from "@/lib/daily-reforecast";
import { localDateHour } from "@/lib/local-clock";

const newest = (over: Partial<NewestReforecast> = {}): NewestReforecast => ({ dataDate: "2027-05-10", stale: false, olderRules: false, changes: 0, seed: "s", iterations: 500, ...over });
const decide = (n: NewestReforecast | null, day = "2027-05-12") => dailyDecision({ day, startDate: "2027-04-01", lastDataDate: "2033-03-31", newest: n });

describe("localDateHour", () => {
  it("reads the clock where the work is, across the date line of UTC", () => {
    // 03:30 UTC on 5 Dec is 21:30 on 4 Dec in Chicago (UTC−6 in winter) and 14:30 in Auckland (UTC+13 in summer).
    const now = new Date("2026-12-05T03:30:00Z");
    expect(localDateHour(now, "America/Chicago")).toEqual({ date: "2026-12-04", hour: 21 });
    expect(localDateHour(now, "Pacific/Auckland")).toEqual({ date: "2026-12-05", hour: 16 });
    expect(localDateHour(now, "Not/AZone")).toEqual({ date: "2026-12-05", hour: 3 });
  });
});

describe("dayToConsider", () => {
  const now = new Date("2026-12-04T13:30:00Z"); // 07:30 in Chicago
  it("is today once the hour has come, and not again that day", () => {
    expect(dayToConsider({ now, timeZone: "America/Chicago", hour: 6, lastOn: null })).toBe("2026-12-04");
    expect(dayToConsider({ now, timeZone: "America/Chicago", hour: 7, lastOn: "2026-12-03" })).toBe("2026-12-04");
    expect(dayToConsider({ now, timeZone: "America/Chicago", hour: 8, lastOn: "2026-12-03" })).toBeNull();
    expect(dayToConsider({ now, timeZone: "America/Chicago", hour: 6, lastOn: "2026-12-04" })).toBeNull();
  });
});

describe("dailyDecision", () => {
  it("re-forecasts from the day before when the field log has changes the newest re-forecast does not know", () => {
    expect(decide(newest({ changes: 2 }))).toEqual({ due: true, dataDate: "2027-05-11", seed: "s", iterations: 500, why: "2 field-log changes are not in the newest re-forecast" });
    expect(decide(newest({ changes: 1 }))).toMatchObject({ due: true, why: "1 field-log change is not in the newest re-forecast" });
  });
  it("re-forecasts when the plan changed since, or when there is none yet (with the Field log's defaults)", () => {
    expect(decide(newest({ stale: true }))).toMatchObject({ due: true, why: "the plan changed since the newest re-forecast" });
    expect(decide(null)).toEqual({ due: true, dataDate: "2027-05-11", seed: "daily", iterations: 1_000, why: "the plan has no re-forecast yet" });
  });
  it("re-forecasts when the newest re-forecast was computed under earlier model rules (the same seed and iterations)", () => {
    expect(decide(newest({ olderRules: true, dataDate: "2027-05-11" }))).toEqual({ due: true, dataDate: "2027-05-11", seed: "s", iterations: 500, why: "the model rules changed since the newest re-forecast" });
  });
  it("waits while nothing changes, for a week", () => {
    expect(decide(newest({ dataDate: "2027-05-11" }))).toEqual({ due: false, why: "the newest re-forecast knows every shift in the field log" });
    expect(decide(newest({ dataDate: "2027-05-05" }))).toMatchObject({ due: false });
    expect(decide(newest({ dataDate: "2027-05-04" }))).toMatchObject({ due: true, dataDate: "2027-05-11", why: "the newest re-forecast is as of 4 May 2027, a week or more ago" });
  });
  it("does not step back behind a re-forecast someone made from today, nor go outside the plan's calendar", () => {
    expect(decide(newest({ dataDate: "2027-05-12", changes: 3 }))).toEqual({ due: false, why: "the newest re-forecast is as of 12 May 2027" });
    expect(decide(null, "2027-04-01")).toEqual({ due: false, why: "the plan starts on 1 Apr 2027" });
    expect(decide(null, "2027-04-02")).toMatchObject({ due: true, dataDate: "2027-04-01" });
    expect(decide(null, "2033-04-02")).toEqual({ due: false, why: "the plan's calendar ends on 31 Mar 2033" });
  });

  it("whatever the newest re-forecast, a due one starts from the day before and never from a date the newest is past", () => {
    const iso = fc.integer({ min: 0, max: 400 }).map((n) => new Date(Date.UTC(2027, 3, 1 + n)).toISOString().slice(0, 10));
    fc.assert(
      fc.property(iso, iso, fc.nat(5), fc.boolean(), (day, dataDate, changes, stale) => {
        const d = decide(newest({ dataDate, changes, stale }), day);
        const dayBefore = new Date(Date.parse(`${day}T00:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
        if (d.due) {
          expect(d.dataDate).toBe(dayBefore);
          expect(dataDate <= dayBefore).toBe(true);
        } else if (dataDate <= dayBefore && dayBefore >= "2027-04-01") {
          // Not due although it could be: nothing changed and the newest is under a week old.
          expect(changes).toBe(0);
          expect(stale).toBe(false);
          expect(Date.parse(dayBefore) - Date.parse(dataDate)).toBeLessThan(QUIET_DAYS * 86_400_000);
        }
      }),
    );
  });
});
