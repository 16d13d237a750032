/** Display helpers shared by server and client components. */
import { format, isValid, parseISO } from "date-fns";

/** 1,250 ft → "STA 12+50" (1 station = 100 ft). */
export function formatStation(ft: number): string {
  const sign = ft < 0 ? "−" : "";
  const abs = Math.abs(ft);
  const sta = Math.floor(abs / 100);
  const rest = abs - sta * 100;
  const restText = rest.toFixed(rest % 1 === 0 ? 0 : 1).padStart(2, "0");
  return `STA ${sign}${sta}+${restText}`;
}

// Every date label goes through date-fns with one set of patterns, so months read the same everywhere ("Sep",
// never "Sept" as some locales' Intl data has it).
export const DATE_PATTERN = "d MMM yyyy";

/** "2027-10-14" → "14 Oct 2027" (a local calendar date: parsed and formatted in the same local time). */
export function formatIsoDate(iso: string | null | undefined): string {
  if (!iso) return "—";
  const d = parseISO(iso.slice(0, 10));
  return isValid(d) ? format(d, DATE_PATTERN) : iso;
}

/** A local calendar date "2027-04-08" → "Thu 8 Apr 2027" (`long`: "Thursday 8 Apr 2027"; `year: false`: "Thu 8 Apr"). */
export function formatIsoDay(iso: string, { long = false, year = true }: { long?: boolean; year?: boolean } = {}): string {
  const d = parseISO(iso.slice(0, 10));
  return isValid(d) ? format(d, `${long ? "EEEE" : "EEE"} d MMM${year ? " yyyy" : ""}`) : iso;
}

/** A local time "2027-04-08T07:00" (no zone: a clock reading where the work is) → "8 Apr 2027 07:00" (`year: false`: "8 Apr 07:00"). */
export function formatIsoClock(iso: string, { year = true }: { year?: boolean } = {}): string {
  const d = parseISO(iso.slice(0, 10));
  return isValid(d) ? `${format(d, year ? DATE_PATTERN : "d MMM")} ${iso.slice(11, 16)}` : iso;
}

/**
 * A local clock time beside its day's row: "14:35" when it falls on `day` ("YYYY-MM-DD"), else with its date,
 * "23 May 02:10" (a queue that ran past midnight); "—" for none.
 */
export function formatClockOnDay(iso: string | null | undefined, day: string): string {
  if (!iso) return "—";
  return iso.slice(0, 10) === day.slice(0, 10) ? iso.slice(11, 16) : formatIsoClock(iso, { year: false });
}

/** A whole local hour 0–23 → "06:00" (the hour pickers and the sentences that name them). */
export function formatHour(h: number): string {
  return `${String(h).padStart(2, "0")}:00`;
}

/**
 * The one time zone every moment (when something was saved, run, sent) is shown in, on the server's pages, in the
 * browser and in e-mails alike — so a page never shows one moment two ways: `POURLINE_TIME_ZONE` on the server
 * (README "Deploying safely"; `npm start` and `npm test` use the demo's America/Chicago), the server's own zone
 * without it; the browser reads what the server wrote on the page (`<html data-time-zone>`, app/layout.tsx).
 */
export function displayTimeZone(): string {
  const set = typeof document !== "undefined" ? document.documentElement.dataset.timeZone : typeof process !== "undefined" ? process.env.POURLINE_TIME_ZONE : undefined;
  return set || Intl.DateTimeFormat().resolvedOptions().timeZone;
}

/** A moment in the display time zone: "4 Dec 2026, 19:40". */
export function formatDateTime(d: Date | string): string {
  return formatDateTimeIn(d, displayTimeZone());
}

// One formatter per zone: building one costs far more than using it, and a table formats hundreds of moments.
const clocks = new Map<string, Intl.DateTimeFormat>();
function clockIn(timeZone: string): Intl.DateTimeFormat {
  let f = clocks.get(timeZone);
  if (!f) clocks.set(timeZone, (f = new Intl.DateTimeFormat("en-US", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" })));
  return f;
}

/**
 * A moment as the clock reads in `timeZone` — "4 Dec 2026, 19:40": formatDateTime's, in the display zone, and the
 * public pages', whose times are all local to the work (the plan's own zone).
 */
export function formatDateTimeIn(d: Date | string, timeZone: string): string {
  const date = typeof d === "string" ? new Date(d) : d;
  if (!isValid(date)) return String(d);
  const parts = clockIn(timeZone).formatToParts(date);
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? "";
  return `${formatIsoDate(`${part("year")}-${part("month")}-${part("day")}`)}, ${part("hour")}:${part("minute")}`;
}

/** Month 1–12 → "Sep" (`long`: "September"). */
export function monthName(month: number, long = false): string {
  return format(new Date(2001, month - 1, 1), long ? "MMMM" : "MMM");
}

/** "1 shift", "2,000 shifts", "3 discovered conditions": a count with its noun, singular only for exactly one. */
export function countText(n: number, one: string, many = `${one}s`): string {
  return `${n.toLocaleString("en-US")} ${n === 1 ? one : many}`;
}

export function formatPercent(p: number | null | undefined, digits = 0): string {
  return p == null ? "—" : `${(p * 100).toFixed(digits)} %`;
}
