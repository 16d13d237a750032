import Link from "next/link";
import { formatDateTime, formatIsoDate, formatPercent } from "@/lib/format";
import type { RunHeadline } from "@/lib/run-record";
import { shiftsNotInText } from "@/lib/plan-of-record-text";

export interface ReforecastHeadline {
  dataDate: string | null;
  summary: RunHeadline | Record<string, unknown>;
  createdAt: Date | string;
  /** Field-log shifts it does not know (db/queries/progress.ts `shiftsNotInRun`). */
  shiftsNotIn: number;
}

/**
 * The Outlook shows the plan as run; once the field log has re-forecast it, that plan run no longer says when the
 * job will finish. Said above the charts, so nobody quotes the plan's P80 when the project list (the plan of
 * record's headline) already quotes the re-forecast's.
 */
export function NewerReforecastNotice({ scenarioId, reforecast, shownRunAt }: { scenarioId: string; reforecast: ReforecastHeadline; shownRunAt: Date | string | null }) {
  const h = reforecast.summary as RunHeadline;
  if (!h?.finish?.p80) return null;
  return (
    <div className="rounded-md border border-brand-700/30 bg-brand-50 px-4 py-3 text-sm" role="status" data-testid="newer-reforecast">
      <p>
        <strong>The field log has moved this forecast on.</strong> Re-forecast from the work recorded up to {reforecast.dataDate ? formatIsoDate(reforecast.dataDate) : "its data date"} (run{" "}
        {formatDateTime(reforecast.createdAt)}): P80 finish <strong>{formatIsoDate(h.finish.p80)}</strong> (P50 {formatIsoDate(h.finish.p50)})
        {h.targetDate && h.targetProbability !== null ? `; ${formatPercent(h.targetProbability)} chance of finishing by the ${formatIsoDate(h.targetDate)} target` : ""}.
        {reforecast.shiftsNotIn > 0 ? ` ${shiftsNotInText(reforecast.shiftsNotIn, "that re-forecast")}.` : ""}
      </p>
      <p className="mt-1">
        {shownRunAt ? `Below is the plan as run on ${formatDateTime(shownRunAt)}, which knows nothing of the work done since. ` : ""}
        <Link className="font-medium text-brand-700 underline" href={`/scenarios/${scenarioId}/progress`}>
          Open the field log and its forecasts
        </Link>
      </p>
    </div>
  );
}
