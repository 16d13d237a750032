/**
 * Calendar arithmetic on local dates without the Date object (fast, time-zone free, identical everywhere).
 * A "day number" counts days since 1970-01-01 in the proleptic Gregorian calendar.
 * Source: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (days_from_civil / civil_from_days).
 */

export interface Ymd {
  y: number;
  m: number; // 1–12
  d: number; // 1–31
}

export function daysFromCivil(y: number, m: number, d: number): number {
  const yy = m <= 2 ? y - 1 : y;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const mp = (m + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

export function civilFromDays(z: number): Ymd {
  const zz = z + 719468;
  const era = Math.floor(zz / 146097);
  const doe = zz - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const d = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const m = mp < 10 ? mp + 3 : mp - 9;
  return { y: yoe + era * 400 + (m <= 2 ? 1 : 0), m, d };
}

/** 0 = Sunday … 6 = Saturday (1970-01-01 was a Thursday). */
export function weekdayOfDayNumber(z: number): number {
  return (((z + 4) % 7) + 7) % 7;
}

export function parseIsoDate(iso: string): number {
  const y = Number(iso.slice(0, 4));
  const m = Number(iso.slice(5, 7));
  const d = Number(iso.slice(8, 10));
  return daysFromCivil(y, m, d);
}

const pad2 = (n: number) => (n < 10 ? `0${n}` : String(n));

export function formatDayNumber(z: number): string {
  const { y, m, d } = civilFromDays(z);
  return `${y}-${pad2(m)}-${pad2(d)}`;
}

/** Local date-time of `hours` after 00:00 of day number `day0`, to the minute: `YYYY-MM-DDTHH:mm`. */
export function formatHours(day0: number, hours: number): string {
  const totalMinutes = Math.round(hours * 60);
  const day = day0 + Math.floor(totalMinutes / 1440);
  const minutes = totalMinutes - Math.floor(totalMinutes / 1440) * 1440;
  return `${formatDayNumber(day)}T${pad2(Math.floor(minutes / 60))}:${pad2(minutes % 60)}`;
}

export function isLeapYear(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

export function daysInMonth(y: number, m: number): number {
  return [31, isLeapYear(y) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][m - 1];
}
