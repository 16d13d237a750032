/**
 * The public travel advisory of a published closure plan, day by day, in plain words: what is closed and when
 * (the closure timeline of the published run, cut at midnight), the expected longest backup (the queue hour by
 * hour along that timeline, sim/hourly-queue — the same D/D/1 as the delay figures), the hours to avoid and
 * whether the day is part of a holiday weekend. Pure: it reads a stored run and simulates nothing.
 */
import { formatDayNumber, parseIsoDate, weekdayOfDayNumber } from "@sim/dates";
import { hourlyQueues } from "@sim/hourly-queue";
import type { RunSummary } from "@sim/summary";
import type { Scenario } from "@sim/schema";
import { breaksLimit, queueLimitOf } from "@sim/queue-limit";
import { compileTraffic } from "@sim/traffic";
import { clock } from "./closure-advice-text";
import { formatIsoDay } from "./format";
import { hoursSince } from "./exports/closures";

/** Hours whose expected backup passes a quarter mile are "hours to avoid": an editorial threshold of this page. */
export const AVOID_MILES = 0.25;

export interface AdvisoryClosure {
  name: string;
  lanes: string[];
  standing: boolean;
  /** Local clock times on this day, e.g. "20:00" to "24:00"; whole day = "00:00" to "24:00". */
  from: string;
  to: string;
}

export interface AdvisoryDay {
  date: string;
  weekday: string;
  holidayWeekend: boolean;
  closures: AdvisoryClosure[];
  /** Longest expected backup of the day, miles (0 when none). */
  longestBackupMiles: number;
  /** Longest expected delay of the day, minutes (the wait of the last vehicle in a queue; 0 when none). */
  longestDelayMinutes: number;
  /** Whether the day's backup passes the plan's own queue limit (sim/queue-limit). */
  overLimit: boolean;
  /** Runs of clock hours whose backup passes AVOID_MILES, e.g. ["15:00–18:00"]. */
  avoid: string[];
}

const WEEKDAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"];

const hhmm = (h: number) => (h >= 24 ? "24:00" : clock(h));

function runs(flags: boolean[]): string[] {
  const out: string[] = [];
  for (let h = 0; h < 24; h++) {
    if (!flags[h] || (h > 0 && flags[h - 1])) continue;
    let e = h;
    while (e + 1 < 24 && flags[e + 1]) e++;
    out.push(`${hhmm(h)}–${hhmm(e + 1)}`);
  }
  return out;
}

/**
 * The days from `today` (local `YYYY-MM-DD`) on that have a closure or a backup, at most `maxDays` of them.
 * Null when the run carries no closure timeline (published before the engine kept one).
 */
export function buildAdvisory(s: Scenario, summary: Pick<RunSummary, "startDate" | "representative">, today: string, maxDays = 45): AdvisoryDay[] | null {
  const timeline = summary.representative.closureTimeline;
  if (!Array.isArray(timeline)) return null;
  const day0 = parseIsoDate(s.startDate);
  const from = Math.max(0, parseIsoDate(today) - day0);
  const periods = timeline.map((p) => ({ ...p, a: hoursSince(s.startDate, p.start), b: hoursSince(s.startDate, p.end) })).filter((p) => p.b > p.a && p.lanes.length > 0);
  const queues = hourlyQueues(s, timeline);
  const limit = queueLimitOf(s);
  const lastDay = Math.ceil(Math.max(0, ...periods.map((p) => p.b)) / 24) + 1;
  const traffic = compileTraffic(s, day0, lastDay + 1);
  const out: AdvisoryDay[] = [];
  for (let d = from; d <= lastDay && out.length < maxDays; d++) {
    const closures: AdvisoryClosure[] = periods
      .filter((p) => p.a < 24 * (d + 1) && p.b > 24 * d)
      .map((p) => ({ name: p.name, lanes: p.lanes, standing: p.kind === "standing", from: hhmm(Math.max(p.a, 24 * d) - 24 * d), to: hhmm(Math.min(p.b, 24 * (d + 1)) - 24 * d) }));
    const row = queues && d - queues.firstDay >= 0 && d - queues.firstDay < queues.miles.length ? queues.miles[d - queues.firstDay] : null;
    const longest = row ? Math.max(...row) : 0;
    const longestMinutes = row ? Math.max(...queues!.minutes[d - queues!.firstDay]) : 0;
    if (closures.length === 0 && longest <= 0) continue;
    out.push({
      date: formatDayNumber(day0 + d),
      weekday: WEEKDAYS[weekdayOfDayNumber(day0 + d)],
      // Demand kind 4 is the holiday peak: the holiday block with its weekend and the getaway day before it.
      holidayWeekend: traffic ? traffic.dayKind[d] === 4 : false,
      closures,
      longestBackupMiles: Math.round(longest * 10) / 10,
      longestDelayMinutes: Math.round(longestMinutes),
      overLimit: breaksLimit(limit, { miles: longest, minutes: longestMinutes }) === true,
      avoid: row ? runs(Array.from(row, (x) => x > AVOID_MILES)) : [],
    });
  }
  return out;
}

/**
 * What a driver reading the advisory before the work resumes needs first: when the first day listed lies after
 * `today` (a winter shutdown, a job not started), "Nothing is planned to be closed before Wednesday 31 Mar 2027."
 * Null when the list starts today or is empty (the page says there is no closure from today on).
 */
export function nothingBeforeText(days: ReadonlyArray<Pick<AdvisoryDay, "date">>, today: string): string | null {
  const first = days[0]?.date;
  return first && first > today ? `Nothing is planned to be closed before ${formatIsoDay(first, { long: true })}.` : null;
}
