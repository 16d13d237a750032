/**
 * A plan of record's newest forecast in words — one wording for the project list, the project page and the
 * forecast e-mail, so what an executive reads on screen and in the inbox is the same sentence.
 */
import { differenceInCalendarDays, isValid, parseISO } from "date-fns";
import { formatDateTime, formatIsoDate, formatPercent } from "@/lib/format";
import type { RunHeadline } from "@/lib/run-record";
import { UNDER_OLDER_RULES } from "@/lib/model-rules-text";

/** A project's plan of record and its newest forecast, as db/queries/projects.ts `planOfRecordParts` selects them. */
export interface PlanOfRecordView {
  planScenarioId: string | null;
  planName: string | null;
  planRunSummary: RunHeadline | Record<string, unknown> | null;
  planRunAt: Date | string | null;
  /** Set when the newest forecast is a re-forecast from the field log: its data date. */
  planRunDataDate: string | null;
  /** The plan changed after that forecast. */
  planRunStale: boolean | null;
  /** Field-log changes that forecast does not know (db/queries/progress.ts `shiftsNotInRun`). */
  planRunShiftsNotIn?: number | null;
  /** That forecast was computed under an earlier revision of the model rules. */
  planRunOlderRules?: boolean | null;
  /** The forecast before the newest, to say how far the finish moved (null: the newest is the only one). */
  previousRunSummary?: RunHeadline | Record<string, unknown> | null;
}

/**
 * How the P80 finish moved from one forecast to the next, in words: "12 days later than the previous forecast",
 * "3 days earlier …", "unchanged …"; null when either date is missing. Calendar days between the dates.
 */
export function p80MoveText(now: string | undefined, before: string | undefined): string | null {
  if (!now || !before) return null;
  const a = parseISO(now.slice(0, 10));
  const b = parseISO(before.slice(0, 10));
  if (!isValid(a) || !isValid(b)) return null;
  const days = differenceInCalendarDays(a, b);
  if (days === 0) return "unchanged since the previous forecast";
  const n = Math.abs(days);
  return `${n.toLocaleString("en-US")} day${n === 1 ? "" : "s"} ${days > 0 ? "later" : "earlier"} than the previous forecast`;
}

/**
 * "3 changes in the field log are not in this forecast" — said wherever a forecast is behind the field. A change is
 * a shift recorded, corrected or deleted that the forecast does not reflect (db/queries/progress.ts `shiftsNotInRun`).
 */
export function changesNotInText(n: number, forecast = "this forecast"): string {
  return `${n.toLocaleString("en-US")} change${n === 1 ? "" : "s"} in the field log ${n === 1 ? "is" : "are"} not in ${forecast}`;
}

/** Which forecast, in words: "Re-forecast from the field log as of 4 Dec 2026, run 4 Dec 2026, 18:57" or "Forecast run …". */
export function forecastSourceText(run: { dataDate: string | null; at: Date | string }): string {
  return run.dataDate ? `Re-forecast from the field log as of ${formatIsoDate(run.dataDate)}, run ${formatDateTime(run.at)}` : `Forecast run ${formatDateTime(run.at)}`;
}

/**
 * When and by whom a forecast was run, for the drift table: "run 4 Dec 2026, 12:57 by Dana Whitcomb", or for one the
 * daily re-forecast asked for, "run 5 Dec 2026, 06:00 by the daily re-forecast, in Dana Whitcomb's name" — a
 * forecast nobody pressed for is not to be read as that person's decision.
 */
export function runMadeText(run: { at: Date | string; byName: string | null; automatic: boolean }): string {
  const at = `run ${formatDateTime(run.at)}`;
  if (run.automatic) return `${at} by the daily re-forecast${run.byName ? `, in ${run.byName}'s name` : ""}`;
  return run.byName ? `${at} by ${run.byName}` : at;
}

/**
 * The lane closures the public sees (every calendar feed and travel advisory shows the publication still standing)
 * came from an earlier forecast than the plan's newest, with other closures from today on: said under the forecast,
 * on the project page and in the forecast e-mail, so whoever publishes knows to publish again; `changes` says what
 * differs (closure-changes.ts `closureChangesText`) when the two forecasts can be compared.
 */
export function publicationLagText(publishedAt: Date | string, changes: string | null = null): string {
  return `The lane closures the public sees (published ${formatDateTime(publishedAt)}) come from an earlier forecast, until someone publishes again from the plan's Share tab.${changes ? ` ${changes}` : ""}`;
}

/** "0 % chance of finishing by the 2 Jul 2027 target" (the percent kept with its sign), or "" without a target. */
export function targetChanceText(targetDate: string | null, probability: number | null): string {
  return targetDate && probability !== null ? `${formatPercent(probability).replace(" ", "\u00a0")} chance of finishing by the ${formatIsoDate(targetDate)} target` : "";
}

/**
 * The newest forecast of a plan of record as "P80 finish {p80}{rest}" plus a line saying which forecast and how old
 * (stale when the plan changed after it, how many field-log changes it does not know, and whether it was computed
 * under earlier model rules); null when not run yet.
 */
export function planForecastText(plan: PlanOfRecordView): { p80: string; rest: string; when: string } | null {
  const h = plan.planRunSummary as RunHeadline | null;
  if (!h?.finish || !plan.planRunAt) return null;
  const move = p80MoveText(h.finish.p80, (plan.previousRunSummary as RunHeadline | null | undefined)?.finish?.p80);
  const chance = targetChanceText(h.targetDate, h.targetProbability);
  const target = chance ? `; ${chance}` : "";
  const source = forecastSourceText({ dataDate: plan.planRunDataDate, at: plan.planRunAt });
  return {
    p80: formatIsoDate(h.finish.p80),
    rest: ` (P50 ${formatIsoDate(h.finish.p50)})${move ? `, ${move}` : ""}${target}.`,
    when: `${source}${plan.planRunStale ? "; the plan has changed since, so this forecast is stale." : "."}${plan.planRunShiftsNotIn ? ` ${changesNotInText(plan.planRunShiftsNotIn)}.` : ""}${plan.planRunOlderRules ? ` It was ${UNDER_OLDER_RULES}.` : ""}`,
  };
}
