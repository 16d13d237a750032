/**
 * U.S. federal holidays by the rules of 5 U.S.C. 6103, computed for any year (never a list of dates).
 * Contract: `federalHolidays(year)` returns the holidays whose legal date falls in `year`, in date order,
 * each with its `observed` date — a Saturday holiday is observed the Friday before, a Sunday one the
 * Monday after. The observed date can fall in the neighbouring year (1 Jan on a Saturday is observed
 * 31 Dec of the year before), so a caller asking "is this date observed?" must look at year + 1 too;
 * `observedFederalHolidayDays` does that.
 * Today's rules are applied to every year, except the two holidays added by later statutes: Martin Luther
 * King Jr.'s Birthday (first observed 1986) and Juneteenth (from 2021). Older history (e.g. Thanksgiving
 * before 1942, fixed-date holidays before 1971) is out of scope: plans are for the present and future.
 */
import { daysFromCivil, formatDayNumber, parseIsoDate, weekdayOfDayNumber } from "./dates";

export interface Holiday {
  name: string;
  /** Legal date, YYYY-MM-DD. */
  date: string;
  /** Date the holiday is observed (moved off a weekend), YYYY-MM-DD. */
  observed: string;
}

const MONDAY = 1;
const THURSDAY = 4;

/** Day number of the n-th (1-based) given weekday of a month. */
function nthWeekday(y: number, m: number, weekday: number, n: number): number {
  const first = daysFromCivil(y, m, 1);
  return first + ((weekday - weekdayOfDayNumber(first) + 7) % 7) + 7 * (n - 1);
}

function lastWeekday(y: number, m: number, lastDay: number, weekday: number): number {
  const last = daysFromCivil(y, m, lastDay);
  return last - ((weekdayOfDayNumber(last) - weekday + 7) % 7);
}

function observedDay(day: number): number {
  const wd = weekdayOfDayNumber(day);
  return wd === 6 ? day - 1 : wd === 0 ? day + 1 : day;
}

export function federalHolidays(year: number): Holiday[] {
  const y = year;
  const days: Array<[string, number]> = [["New Year's Day", daysFromCivil(y, 1, 1)]];
  if (y >= 1986) days.push(["Birthday of Martin Luther King, Jr.", nthWeekday(y, 1, MONDAY, 3)]);
  days.push(["Washington's Birthday", nthWeekday(y, 2, MONDAY, 3)]);
  days.push(["Memorial Day", lastWeekday(y, 5, 31, MONDAY)]);
  if (y >= 2021) days.push(["Juneteenth National Independence Day", daysFromCivil(y, 6, 19)]);
  days.push(["Independence Day", daysFromCivil(y, 7, 4)]);
  days.push(["Labor Day", nthWeekday(y, 9, MONDAY, 1)]);
  days.push(["Columbus Day", nthWeekday(y, 10, MONDAY, 2)]);
  days.push(["Veterans Day", daysFromCivil(y, 11, 11)]);
  days.push(["Thanksgiving Day", nthWeekday(y, 11, THURSDAY, 4)]);
  days.push(["Christmas Day", daysFromCivil(y, 12, 25)]);
  return days.map(([name, day]) => ({ name, date: formatDayNumber(day), observed: formatDayNumber(observedDay(day)) }));
}

/** Day numbers (see `./dates`) of every observed federal holiday falling in years `firstYear`…`lastYear`. */
export function observedFederalHolidayDays(firstYear: number, lastYear: number): Set<number> {
  const out = new Set<number>();
  const lo = daysFromCivil(firstYear, 1, 1);
  const hi = daysFromCivil(lastYear, 12, 31);
  for (let y = firstYear; y <= lastYear + 1; y++) {
    for (const h of federalHolidays(y)) {
      const d = parseIsoDate(h.observed);
      if (d >= lo && d <= hi) out.add(d);
    }
  }
  return out;
}
