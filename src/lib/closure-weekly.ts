/**
 * The weekly closure e-mail to a project's closure-notice subscribers (src/lib/server/closure-weekly.ts sends it):
 * when it is due, which days it covers, and its words. Pure: the clock and the published plan come in as arguments.
 */
import { formatDayNumber, parseIsoDate, weekdayOfDayNumber } from "@sim/dates";
import type { AdvisoryDay } from "./advisory";
import { formatHour, formatIsoDay } from "./format";
import { localDateHour } from "./local-clock";

export const WEEKDAY_NAMES = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"] as const;

/** Days an e-mail covers: the day it goes out and the six after it. */
export const WEEK_DAYS = 7;

/**
 * The local day (`YYYY-MM-DD`, the published plan's time zone) the e-mail is due on at `now`: its weekday, at or after
 * its hour, and not yet sent or skipped for that day. Null otherwise.
 */
export function weeklyDueDay(v: { now: Date; timeZone: string; weekday: number; hour: number; lastOn: string | null }): string | null {
  const { date, hour } = localDateHour(v.now, v.timeZone);
  if (weekdayOfDayNumber(parseIsoDate(date)) !== v.weekday || hour < v.hour) return null;
  return v.lastOn !== null && v.lastOn >= date ? null : date;
}

/** The last day an e-mail sent on `day` covers. */
export const weekEnd = (day: string): string => formatDayNumber(parseIsoDate(day) + WEEK_DAYS - 1);

/** The advisory's days (src/lib/advisory.ts `buildAdvisory`, from `day` on) that fall in the week from `day`. */
export const daysOfWeek = (days: AdvisoryDay[], day: string): AdvisoryDay[] => days.filter((d) => d.date >= day && d.date <= weekEnd(day));

/** One day of the e-mail: its closures with their hours, the longest backup and the hours to avoid. */
export function weekDayLines(d: AdvisoryDay): string[] {
  const head = `${formatIsoDay(d.date)}${d.holidayWeekend ? " (holiday weekend)" : ""}`;
  const closures = d.closures.map((c) => `  ${c.from}–${c.to}  ${c.name} (${c.lanes.join(", ")} closed${c.standing ? ", round the clock" : ""})`);
  const backup =
    d.longestBackupMiles >= 0.1
      ? `  Expected longest backup ${d.longestBackupMiles.toFixed(1)} mi${d.avoid.length ? `; avoid ${d.avoid.join(", ")} if you can` : ""}.`
      : "  No significant backup expected.";
  return [head, ...closures, backup];
}

/** The week's words, shared by the e-mail and the Share page's note: "3 days with closures from Fri 4 Dec 2026 to Thu 10 Dec 2026". */
export function weekSummary(days: AdvisoryDay[], day: string): string {
  const n = days.filter((d) => d.closures.length > 0).length;
  return `${n === 0 ? "no day" : `${n} day${n === 1 ? "" : "s"}`} with closures from ${formatIsoDay(day)} to ${formatIsoDay(weekEnd(day))}`;
}

/** "on Friday after 07:00" — when the setting sends, in words. */
export function weeklyWhenText(weekday: number, hour: number): string {
  return `on ${WEEKDAY_NAMES[weekday]} after ${formatHour(hour)}`;
}

/** "Weekly on Friday after 07:00" — the setting in words. */
export function weeklySettingText(weekday: number, hour: number): string {
  return `Weekly ${weeklyWhenText(weekday, hour)}`;
}
