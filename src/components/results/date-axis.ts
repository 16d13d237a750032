/**
 * Dates on chart axes. Contract: every chart x value is an absolute day number (days since 1970-01-01, as
 * in sim/dates) plus the fraction of the day, so runs of scenarios with different start dates share one axis.
 * `dateTicks` picks calendar-aligned ticks (days, weeks or first-of-month) so labels read as dates people use.
 * Charts pass them with `interval="preserveStart"` (or recharts' default): on a phone-wide chart recharts drops
 * the ticks whose labels would overlap the one before, instead of printing "7 Jun 202721 Jun".
 */
import { civilFromDays, daysFromCivil, formatDayNumber, parseIsoDate } from "@sim/dates";
import { formatIsoDate, monthName } from "@/lib/format";

/** "2027-10-14" or "2027-10-14T15:30" → day number (+ fraction); "unfinished" or junk → null. */
export function isoToDay(iso: string | null | undefined): number | null {
  if (!iso || !/^\d{4}-\d{2}-\d{2}/.test(iso)) return null;
  let z = parseIsoDate(iso);
  const t = /T(\d{2}):(\d{2})/.exec(iso);
  if (t) z += (Number(t[1]) * 60 + Number(t[2])) / 1440;
  return z;
}

/** Hours since 00:00 of the ISO start date → day number (+ fraction). */
export function hoursToDay(startIso: string, hours: number): number {
  return parseIsoDate(startIso) + hours / 24;
}

export function dayToIso(z: number): string {
  return formatDayNumber(Math.floor(z));
}

/** A day number as "14 Oct 2027". */
export function formatDay(z: number): string {
  return formatIsoDate(dayToIso(z));
}

export interface Ticks {
  ticks: number[];
  /** Label of one tick: "Oct 2027" for month steps, "14 Oct" (or "14 Oct 2027" at a year change) for day steps. */
  label: (z: number) => string;
}

const DAY_STEPS = [1, 2, 7, 14];
const MONTH_STEPS = [1, 2, 3, 6, 12];

/** At most `maxTicks` calendar-aligned ticks covering [lo, hi] (day numbers). */
export function dateTicks(lo: number, hi: number, maxTicks = 8): Ticks {
  const a = Math.floor(lo);
  const b = Math.ceil(hi);
  const span = Math.max(1, b - a);
  for (const step of DAY_STEPS) {
    if (span / step > maxTicks) continue;
    // Weekly steps start on a Monday (weekday 1) so ticks fall on the start of work weeks.
    let first = a;
    if (step >= 7) while ((((first + 4) % 7) + 7) % 7 !== 1) first++;
    const ticks: number[] = [];
    for (let z = first; z <= b; z += step) ticks.push(z);
    return { ticks, label: dayLabel(ticks) };
  }
  const start = civilFromDays(a);
  const end = civilFromDays(b);
  const months = (end.y - start.y) * 12 + (end.m - start.m) + 1;
  const step = MONTH_STEPS.find((s) => months / s <= maxTicks) ?? Math.ceil(months / maxTicks / 12) * 12;
  const ticks: number[] = [];
  // First of a month on the step grid (January-aligned), at or after `a`.
  let y = start.y;
  let m = start.m;
  if (civilFromDays(a).d !== 1) m++;
  let idx = y * 12 + (m - 1);
  idx = Math.ceil(idx / step) * step;
  for (;;) {
    y = Math.floor(idx / 12);
    m = (idx % 12) + 1;
    const z = daysFromCivil(y, m, 1);
    if (z > b) break;
    ticks.push(z);
    idx += step;
  }
  return {
    ticks,
    label: (z) => {
      const c = civilFromDays(Math.floor(z));
      return `${monthName(c.m)} ${c.y}`;
    },
  };
}

function dayLabel(ticks: number[]): (z: number) => string {
  const firstYear = ticks.length ? civilFromDays(ticks[0]).y : 0;
  return (z) => {
    const c = civilFromDays(Math.floor(z));
    const base = `${c.d} ${monthName(c.m)}`;
    return c.y !== firstYear || Math.floor(z) === ticks[0] ? `${base} ${c.y}` : base;
  };
}
