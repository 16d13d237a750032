/**
 * The sentence a stored re-forecast shows about its weather: which days after the data date came from the
 * weather forecast (the summary's `forecastDates`) and which forecast (its fetch time on the scenario's clock),
 * or that the climate profile ran throughout and when a forecast would have been used.
 */
import { formatIsoDate, monthName } from "@/lib/format";

/** "7 Apr 2027, 14:05" on the clock of `timeZone` (UTC when Intl does not know the name). */
export function formatInZone(iso: string, timeZone: string): string {
  const at = new Date(iso);
  if (Number.isNaN(at.getTime())) return iso;
  const parts = (tz: string) =>
    Object.fromEntries(
      new Intl.DateTimeFormat("en-US", { timeZone: tz, year: "numeric", month: "numeric", day: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23" })
        .formatToParts(at)
        .map((p) => [p.type, p.value]),
    );
  let p: Record<string, string>;
  try {
    p = parts(timeZone);
  } catch {
    p = parts("UTC");
  }
  return `${Number(p.day)} ${monthName(Number(p.month))} ${p.year}, ${p.hour}:${p.minute}`;
}

export function forecastSourceSentence(args: { forecastDates: readonly string[] | undefined; fetchedAt: string | null | undefined; timeZone: string; maxAgeHours: number }): string {
  const dates = args.forecastDates ?? [];
  if (dates.length === 0 || !args.fetchedAt)
    return `The weather came from the climate profile throughout: a re-forecast starts from the weather forecast only when its data date is today and the project has a forecast fetched within the last ${args.maxAgeHours} hours.`;
  const n = dates.length;
  const days = n === 1 ? "Day 1" : `Days 1–${n}`;
  const span = n === 1 ? formatIsoDate(dates[0]) : `${formatIsoDate(dates[0])} to ${formatIsoDate(dates[n - 1])}`;
  return `${days} after the data date (${span}) came from the weather forecast fetched ${formatInZone(args.fetchedAt, args.timeZone)}; the climate profile after ${n === 1 ? "it" : "them"}.`;
}
