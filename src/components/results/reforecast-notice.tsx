import Link from "next/link";
import { formatDateTime, formatIsoDate } from "@/lib/format";
import type { RunHeadline } from "@/lib/run-record";
import { planForecastText, changesNotInText } from "@/lib/plan-of-record-text";
import { olderRulesText } from "@/lib/model-rules-text";

export interface ReforecastHeadline {
  dataDate: string | null;
  summary: RunHeadline | Record<string, unknown>;
  createdAt: Date | string;
  /** Field-log changes it does not know (db/queries/progress.ts `shiftsNotInRun`). */
  shiftsNotIn: number;
  /** The plan changed after it (the data layer's stale rule); it is still the forecast until the next re-forecast. */
  stale?: boolean | null;
  /** Computed under an earlier revision of the model rules (the data layer's `olderRules`), and that revision. */
  olderRules?: boolean | null;
  modelRevision?: number;
}

/**
 * The Outlook and the owner brief show the plan as run; once the field log has re-forecast it, that plan run no
 * longer says when the job will finish. Said above the charts, so nobody quotes the plan's P80 when the project list
 * (the plan of record's headline) already quotes the re-forecast's. `document`: the printed brief (no link); `scenarioId` null: a share link's page (no link either).
 */
export function ReforecastNotice(props: { scenarioId: string | null; reforecast: ReforecastHeadline; shownRunAt: Date | string | null; document?: boolean }) {
  const { scenarioId, reforecast, shownRunAt, document = false } = props;
  // The project list's words for a forecast (without "how far it moved", which the drift chart says).
  const text = planForecastText({ planScenarioId: scenarioId, planName: null, planRunSummary: reforecast.summary, planRunAt: reforecast.createdAt, planRunDataDate: reforecast.dataDate, planRunStale: false });
  if (!text) return null;
  return (
    <div className="rounded-md border border-brand-700/30 bg-brand-50 px-4 py-3 text-sm" role="status" data-testid="newer-reforecast">
      <p>
        <strong>The field log has moved this forecast on.</strong> Re-forecast from the work recorded up to {reforecast.dataDate ? formatIsoDate(reforecast.dataDate) : "its data date"} (run{" "}
        {formatDateTime(reforecast.createdAt)}): P80 finish <strong>{text.p80}</strong>
        {text.rest}
        {reforecast.shiftsNotIn > 0 ? ` ${changesNotInText(reforecast.shiftsNotIn, "that re-forecast")}.` : ""}
        {reforecast.stale ? " The plan has changed since that re-forecast, so it is stale until the next one." : ""}
        {reforecast.olderRules ? ` ${olderRulesText("That re-forecast", reforecast.modelRevision ?? 1)} The next re-forecast uses today's rules.` : ""}
      </p>
      <p className="mt-1">
        {shownRunAt ? `Below is the plan as run on ${formatDateTime(shownRunAt)}, which knows nothing of the work done since. ` : ""}
        {/* The printed brief has nothing to click; a share link's reader (no scenario id) has no field log to open. */}
        {!document && scenarioId && (
          <>
            <Link className="font-medium text-brand-700 underline" href={`/scenarios/${scenarioId}/progress`}>
              Open the field log and its forecasts
            </Link>
            {" · "}
            {/* The closures still ahead: the Outlook's own calendar export is of the plan run drawn below it. */}
            <a className="font-medium text-brand-700 underline" href={`/api/scenarios/${scenarioId}/exports/closures.ics?of=forecast`} download>
              The re-forecast&apos;s planned closures (calendar)
            </a>
          </>
        )}
      </p>
    </div>
  );
}
