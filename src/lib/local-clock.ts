/**
 * The clock where the work is: the date and hour at an instant in a plan's IANA time zone (UTC when the name is not
 * one Intl knows). One reading for every "today" and "after the hour" rule — the field log's, the week-ahead e-mail's,
 * the daily re-forecast's. Pure JS (Intl is part of the language), so browser and server read alike.
 */

/** The local date ("2026-12-04") and hour (0–23) of `now` in `timeZone`. */
export function localDateHour(now: Date, timeZone: string): { date: string; hour: number } {
  const read = (tz: string) => {
    const parts = new Intl.DateTimeFormat("en-CA", { timeZone: tz, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", hourCycle: "h23" }).formatToParts(now);
    const get = (t: string) => parts.find((p) => p.type === t)!.value;
    return { date: `${get("year")}-${get("month")}-${get("day")}`, hour: Number(get("hour")) };
  };
  try {
    return read(timeZone);
  } catch {
    return read("UTC");
  }
}

/** The calendar date at `now` on the clock of `timeZone`, `YYYY-MM-DD`. */
export const localDate = (now: Date, timeZone: string): string => localDateHour(now, timeZone).date;

/** The local hour (0–23) at `now` on the clock of `timeZone`. */
export const localHour = (now: Date, timeZone: string): number => localDateHour(now, timeZone).hour;
