import Link from "next/link";
import { planForecastText, type PlanOfRecordView } from "@/lib/plan-of-record-text";

export type { PlanOfRecordView } from "@/lib/plan-of-record-text";

/**
 * One paragraph an executive can read aloud: which plan, when it finishes at P80 (and P50), the chance of meeting
 * the target, and how old the forecast is — said as stale when the plan changed after it. The words are
 * src/lib/plan-of-record-text.ts's, the same as the forecast e-mail's. `progress`: how far the field log says the
 * job has got (src/lib/server/plan-progress.ts), said under the forecast; `against`: how it stands against the plan
 * run; `publicationLag`: the closures the public sees came from an earlier forecast.
 */
export function PlanOfRecordHeadline({
  plan,
  link = false,
  progress = null,
  against = null,
  publicationLag = null,
}: {
  plan: PlanOfRecordView;
  link?: boolean;
  progress?: string | null;
  against?: string | null;
  /** The closures published for the public lag this forecast (src/lib/server/closure-notices.ts `publicationLagTexts`). */
  publicationLag?: string | null;
}) {
  if (!plan.planScenarioId || !plan.planName) return <p className="text-sm text-muted">No plan of record chosen yet.</p>;
  const name = link ? (
    <Link href={`/scenarios/${plan.planScenarioId}`} className="font-medium text-brand-700 hover:underline">
      {plan.planName}
    </Link>
  ) : (
    <span className="font-medium">{plan.planName}</span>
  );
  const text = planForecastText(plan);
  const progressLine = (progress || against) && (
    <>
      {progress && (
        <p className="mt-1 text-sm" data-testid="plan-progress">
          {progress}
        </p>
      )}
      {against && (
        <p className="mt-0.5 text-sm" data-testid="plan-against">
          {against}
        </p>
      )}
    </>
  );
  if (!text) {
    return (
      <div className="text-sm">
        <p>{name}: not run yet.</p>
        {progressLine}
      </div>
    );
  }
  return (
    <div className="text-sm" data-testid="plan-of-record-headline">
      <p>
        {name}: P80 finish <strong>{text.p80}</strong>
        {text.rest}
      </p>
      <p className="mt-0.5 text-xs text-muted">{text.when}</p>
      {progressLine}
      {publicationLag && (
        <p className="mt-1 text-sm text-warn" data-testid="plan-publication-lag">
          {publicationLag}
        </p>
      )}
    </div>
  );
}
