import Link from "next/link";
import { differenceInCalendarDays, isValid, parseISO } from "date-fns";
import { formatDateTime, formatIsoDate, formatPercent } from "@/lib/format";
import type { RunHeadline } from "@/lib/run-record";

/** A project's plan of record and its newest forecast, as the project list and the project page show it. */
export interface PlanOfRecordView {
  planScenarioId: string | null;
  planName: string | null;
  planRunSummary: RunHeadline | Record<string, unknown> | null;
  planRunAt: Date | string | null;
  /** Set when the newest forecast is a re-forecast from the field log: its data date. */
  planRunDataDate: string | null;
  /** The plan changed after that forecast. */
  planRunStale: boolean | null;
  /** Field-log shifts that forecast does not know (db/queries/progress.ts `shiftsNotInRun`). */
  planRunShiftsNotIn?: number | null;
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

/** "3 shifts in the field log are not in this forecast" — said wherever a forecast is behind the field. */
export function shiftsNotInText(n: number, forecast = "this forecast"): string {
  return `${n.toLocaleString("en-US")} shift${n === 1 ? "" : "s"} in the field log ${n === 1 ? "is" : "are"} not in ${forecast}`;
}

/**
 * One paragraph an executive can read aloud: which plan, when it finishes at P80 (and P50), the chance of meeting
 * the target, and how old the forecast is — said as stale when the plan changed after it.
 */
export function PlanOfRecordHeadline({ plan, link = false }: { plan: PlanOfRecordView; link?: boolean }) {
  if (!plan.planScenarioId || !plan.planName) return <p className="text-sm text-muted">No plan of record chosen yet.</p>;
  const name = link ? (
    <Link href={`/scenarios/${plan.planScenarioId}`} className="font-medium text-brand-700 hover:underline">
      {plan.planName}
    </Link>
  ) : (
    <span className="font-medium">{plan.planName}</span>
  );
  const h = plan.planRunSummary as RunHeadline | null;
  if (!h || !plan.planRunAt) return <p className="text-sm">{name}: not run yet.</p>;
  const move = p80MoveText(h.finish.p80, (plan.previousRunSummary as RunHeadline | null | undefined)?.finish?.p80);
  return (
    <div className="text-sm" data-testid="plan-of-record-headline">
      <p>
        {name}: P80 finish <strong>{formatIsoDate(h.finish.p80)}</strong> (P50 {formatIsoDate(h.finish.p50)}){move ? `, ${move}` : ""}
        {h.targetDate && h.targetProbability !== null ? (
          <>
            ; <span className="whitespace-nowrap">{formatPercent(h.targetProbability)}</span> chance of finishing by the {formatIsoDate(h.targetDate)} target
          </>
        ) : null}
        .
      </p>
      <p className="mt-0.5 text-xs text-muted">
        {plan.planRunDataDate ? `Re-forecast from the field log as of ${formatIsoDate(plan.planRunDataDate)}, run ${formatDateTime(plan.planRunAt)}` : `Forecast run ${formatDateTime(plan.planRunAt)}`}
        {plan.planRunStale ? "; the plan has changed since, so this forecast is stale." : "."}
        {plan.planRunShiftsNotIn ? ` ${shiftsNotInText(plan.planRunShiftsNotIn)}.` : ""}
      </p>
    </div>
  );
}
