import Link from "next/link";
import type { Metadata } from "next";
import { RevisionChanges } from "@/components/plan-editor/revision-changes";
import { requireScenario } from "@/lib/server/access";
import { getOutlookRuns } from "@db/queries/runs";
import { VerificationBadge } from "@/components/results/verification-badge";
import { can } from "@/lib/permissions";
import { formatDateTime } from "@/lib/format";
import type { RunSummary } from "@sim/index";
import { OutlookRun } from "@/components/results/outlook-run";
import { planComputationKey } from "@/lib/run-keys";
import { RunPanel } from "@/components/run/run-panel";
import { SafetyNote } from "@/components/safety-note";
import { orNotFound } from "@/lib/server/page-access";
import { resultsRunOf } from "@/lib/run-record";
import { parseScenario } from "@sim/validate";
import { weatherFeasibility } from "@sim/feasibility";
import { getNewestReforecastHeadline } from "@db/queries/progress";
import { ReforecastNotice } from "@/components/results/reforecast-notice";
import { olderRulesText } from "@/lib/model-rules-text";

export const metadata: Metadata = { title: "Outlook" };

/** The versions saved after `from` up to `to`, newest first, at most five. */
const versionsSince = (from: number, to: number) => Array.from({ length: Math.min(5, Math.max(0, to - from)) }, (_, i) => to - i);

export default async function OutlookPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario, role, archived } = await orNotFound(requireScenario(scenarioId, "read"));
  const [{ forecast, unverified }, reforecast] = await Promise.all([getOutlookRuns({ scenarioId }), getNewestReforecastHeadline({ scenarioId })]);
  // A newer browser run is shown at once, marked as not verified; a rejected one is never shown as the forecast.
  const pending = unverified?.verification === "pending" ? unverified : null;
  const run = pending ?? forecast;
  const stale = !!run && run.stale;
  const parsed = parseScenario(scenario.definition);
  // A plan the weather never lets finish is said in words here, before anyone starts a run.
  const blockers = parsed.ok ? weatherFeasibility(parsed.scenario).map((p) => p.message) : [];
  return (
    <div className="space-y-5">
      <RunPanel scenarioId={scenario.id} version={scenario.version} definition={scenario.definition} canRun={can(role, "runScenario", archived)} blockers={blockers} />
      {/* The newest re-forecast is the forecast whenever there is one, however recent the plan run shown (runs.ts `forecastOrder`). */}
      {reforecast && <ReforecastNotice scenarioId={scenario.id} reforecast={reforecast} shownRunAt={run?.createdAt ?? null} />}
      {unverified?.verification === "rejected" && (
        <p className="rounded-md border border-bad/30 bg-bad/10 px-4 py-2 text-sm" role="alert" data-testid="rejected-run">
          The run of {formatDateTime(unverified.createdAt)} ({unverified.iterations.toLocaleString("en-US")} iterations, seed “{unverified.seed}”) did not match the server’s
          own computation of the same version and seed, so it is not shown. {forecast ? "Below is the latest forecast the server stands behind." : ""}
        </p>
      )}
      <OutlookRun
        scenarioId={scenario.id}
        scenarioVersion={scenario.version}
        definition={scenario.definition}
        shownHeading={reforecast ? "Plan run" : undefined}
        tradeoffNote={
          reforecast && (
            <>
              On a job under way this weighs the whole plan from its start date, holidays already past included.{" "}
              {can(role, "runScenario", archived) ? (
                <>
                  For the rest of the job, vary the holiday policy in a{" "}
                  <Link className="font-medium text-brand-700 underline" href={`/scenarios/${scenario.id}/search`}>
                    plan search from the field log
                  </Link>
                  .
                </>
              ) : (
                "A plan search from the field log weighs it for the rest of the job."
              )}
            </>
          )
        }
        shown={run ? { key: planComputationKey(run), summary: run.results as unknown as RunSummary, run: resultsRunOf(run) } : null}
        header={
          run && (
            <>
              {pending && (
                <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="pending-run">
                  Not yet verified: this run was computed in a browser and the server is reproducing it. Until then it is not the scenario’s forecast
                  {forecast ? ` (the last verified one is from ${formatDateTime(forecast.createdAt)})` : ""}.
                </p>
              )}
              {stale && (
                <div className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" data-testid="stale-run">
                  <p role="status">
                    This run was computed from version {run.scenarioVersion}; the plan has changed since (now version {scenario.version}).{" "}
                    {can(role, "runScenario", archived) ? "Run it again for a current forecast." : "A current forecast needs someone who runs plans to run it again."}
                  </p>
                  {/* What the saves since the run changed, newest first (the last five), each opened on request. */}
                  <div className="mt-1 text-xs" data-testid="changes-since-run">
                    {versionsSince(run.scenarioVersion, scenario.version).map((v) => (
                      <RevisionChanges key={v} scenarioId={scenario.id} version={v} />
                    ))}
                  </div>
                </div>
              )}
              {run.olderRules && (
                <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="older-rules-run">
                  {olderRulesText("This run", run.modelRevision)}{" "}
                  {can(role, "runScenario", archived) ? "Run it again for figures under today’s rules." : "Figures under today’s rules need someone who runs plans to run it again."}
                </p>
              )}
              <nav aria-label="Exports" className="flex flex-wrap items-center gap-2 text-sm">
                <span className="text-muted">Take it with you:</span>
                <a className="btn-secondary" href={`/scenarios/${scenario.id}/brief`}>
                  Owner brief
                </a>
                <a className="btn-secondary" href={`/api/scenarios/${scenario.id}/exports/results.csv`} download>
                  Percentiles (CSV)
                </a>
                <a className="btn-secondary" href={`/api/scenarios/${scenario.id}/exports/results.csv?part=trace`} download>
                  Time–distance trace (CSV)
                </a>
                <a className="btn-secondary" href={`/api/scenarios/${scenario.id}/exports/closures.ics`} download>
                  {reforecast ? "Planned closures of the plan run (calendar)" : "Planned closures (calendar)"}
                </a>
              </nav>
              <p className="text-sm text-muted">
                <VerificationBadge verification={run.verification} /> {pending ? "Newest run" : reforecast ? "Plan run" : "Forecast"}: {run.iterations.toLocaleString("en-US")} iterations, seed “{run.seed}”,{" "}
                {formatDateTime(run.createdAt)}
                {run.createdByName ? ` by ${run.createdByName}` : ""}.
              </p>
            </>
          )
        }
        empty={
          <div className="card text-center" data-testid="no-run">
            <h2>No forecast yet</h2>
            <p className="mt-2 text-sm text-muted">
              {archived
                ? "It was not run before the project was archived."
                : can(role, "runScenario")
                  ? "Run the scenario above to see its finish-date confidence and time–distance chart." : "An engineer or scheduler has not run this scenario yet."}
            </p>
          </div>
        }
      />
      <SafetyNote />
    </div>
  );
}
