/**
 * When the daily re-forecast of a plan of record is due, and from which data date — pure, so the server's pass and
 * the tests judge alike. The field log is written during and after a shift (a night shift ends in the morning),
 * so each morning's re-forecast starts from the day before: the last day whose shifts are in.
 *
 * It is due once a local day, after the chosen hour, when the newest re-forecast is behind: the field log has
 * changes it does not know, the plan was edited since, the engine's model rules changed since, or it is a week old (so a job with nothing recorded — rain,
 * a winter shut-down — still has its forecast move on with the calendar, and members who asked for forecast
 * e-mails are not written to every morning about nothing).
 */
import { addDays, format, parseISO } from "date-fns";
import { formatHour, formatIsoDate } from "./format";
import { localDateHour } from "./local-clock";

/** A week: how old the newest re-forecast may grow while nothing changes. */
export const QUIET_DAYS = 7;
/** The work of one daily re-forecast when the plan has none before it to follow (the Field log's own default). */
export const DAILY_ITERATIONS = 1_000;
export const DAILY_SEED = "daily";

const shiftDay = (iso: string, days: number) => format(addDays(parseISO(iso), days), "yyyy-MM-dd");

/** The local day whose re-forecast this pass should consider, or null (before the hour, or already considered). */
export function dayToConsider(input: { now: Date; timeZone: string; hour: number; lastOn: string | null }): string | null {
  const local = localDateHour(input.now, input.timeZone);
  if (local.hour < input.hour) return null;
  return input.lastOn !== null && input.lastOn >= local.date ? null : local.date;
}

export interface NewestReforecast {
  dataDate: string;
  /** Made of an earlier version of the plan (the data layer's `staleSql`). */
  stale: boolean;
  /** Computed under an earlier revision of the model rules (the data layer's `olderRulesSql`). */
  olderRules: boolean;
  /** Field-log changes it does not know (the data layer's `shiftsNotInRun`). */
  changes: number;
  seed: string;
  iterations: number;
}

export type DailyDecision =
  | { due: true; dataDate: string; seed: string; iterations: number; why: string }
  | { due: false; why: string };

/**
 * On local day `day`, whether to re-forecast and with what. `lastDataDate`: the plan's last day the engine
 * reaches (a data date after it is refused). Seed and iterations follow the newest re-forecast, so a day's change
 * in the forecast comes from the field, not from a different draw.
 */
export function dailyDecision(input: { day: string; startDate: string; lastDataDate: string; newest: NewestReforecast | null }): DailyDecision {
  const dataDate = shiftDay(input.day, -1);
  if (dataDate < input.startDate) return { due: false, why: `the plan starts on ${formatIsoDate(input.startDate)}` };
  if (dataDate > input.lastDataDate) return { due: false, why: `the plan's calendar ends on ${formatIsoDate(input.lastDataDate)}` };
  const n = input.newest;
  const draw = { seed: n?.seed ?? DAILY_SEED, iterations: n?.iterations ?? DAILY_ITERATIONS };
  if (!n) return { due: true, dataDate, ...draw, why: "the plan has no re-forecast yet" };
  // Someone re-forecast from today already: an older data date would only step back.
  if (n.dataDate > dataDate) return { due: false, why: `the newest re-forecast is as of ${formatIsoDate(n.dataDate)}` };
  if (n.changes > 0) return { due: true, dataDate, ...draw, why: `${n.changes} field-log ${n.changes === 1 ? "change is" : "changes are"} not in the newest re-forecast` };
  if (n.stale) return { due: true, dataDate, ...draw, why: "the plan changed since the newest re-forecast" };
  if (n.olderRules) return { due: true, dataDate, ...draw, why: "the model rules changed since the newest re-forecast" };
  if (n.dataDate <= shiftDay(dataDate, -QUIET_DAYS)) return { due: true, dataDate, ...draw, why: `the newest re-forecast is as of ${formatIsoDate(n.dataDate)}, a week or more ago` };
  return { due: false, why: "the newest re-forecast knows every shift in the field log" };
}

/** The setting as the project page shows it (db/queries/daily-reforecast.ts `getDailyReforecast`). */
export interface DailyReforecastState {
  hour: number | null;
  byName: string | null;
  note: string | null;
}

/** What the daily re-forecast does, in words, for everyone on the project. */
export function dailyReforecastText(s: DailyReforecastState): string {
  if (s.hour === null) return "Re-forecast by hand only: someone presses Re-forecast on the plan's Field log.";
  return `Re-forecast each morning after ${formatHour(s.hour)} (the plan's time zone) from the field log as of the day before, when the log, the plan or the engine's model rules changed, or the newest re-forecast is a week old${s.byName ? `; set up by ${s.byName}, in whose name it runs` : ""}.`;
}
