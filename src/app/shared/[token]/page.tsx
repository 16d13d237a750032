import type { Metadata } from "next";
import { loadSharedScenario } from "@/lib/server/shared";
import { formatDateTime } from "@/lib/format";
import type { RunSummary } from "@sim/summary";
import { ResultsView } from "@/components/results";
import { SharedPageFrame } from "@/components/shared-page-frame";
import { InputsSummary } from "./inputs-summary";
import { orNotFound } from "@/lib/server/page-access";
import { resultsRunOf } from "@/lib/run-record";
import { VerificationBadge } from "@/components/results/verification-badge";
import { ReforecastNotice } from "@/components/results/reforecast-notice";

// A share link is a bearer secret: keep it out of search engines and out of Referer headers.
export const metadata: Metadata = { title: "Shared forecast", robots: { index: false, follow: false }, referrer: "no-referrer" };

export default async function SharedPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const shared = await orNotFound(loadSharedScenario(token));
  const { link, project, scenario, run, reforecast } = shared;
  const stale = !!run && run.stale;
  return (
    <SharedPageFrame expiresAt={link.expiresAt} project={project}>
      <div>
        <h1 data-testid="scenario-name">{scenario.name}</h1>
        {scenario.description && <p className="mt-1 max-w-3xl text-sm">{scenario.description}</p>}
        <p className="mt-1 text-xs text-muted">
          Plan version {scenario.version}, last saved {formatDateTime(scenario.updatedAt)}
          {scenario.updatedByName ? ` by ${scenario.updatedByName}` : ""}
          {link.label ? ` · shared as “${link.label}”` : ""}
        </p>
      </div>

      {/* The newest re-forecast is the forecast whenever there is one (runs.ts `forecastOrder`); no link to the field
          log: the link's reader has no account to follow it with. */}
      {reforecast && <ReforecastNotice scenarioId={null} reforecast={reforecast} shownRunAt={run?.createdAt ?? null} />}
      {run ? (
        <>
          <p className="text-sm text-muted">
            <VerificationBadge verification={run.verification} /> {reforecast ? "Plan run" : "Forecast"}: {run.iterations.toLocaleString("en-US")} iterations, {formatDateTime(run.createdAt)}
            {run.createdByName ? ` by ${run.createdByName}` : ""}
            {stale ? ` — computed from plan version ${run.scenarioVersion}; the plan has changed since.` : "."}
          </p>
          <ResultsView
            summary={run.results as unknown as RunSummary}
            definition={scenario.definition}
            run={resultsRunOf(run)}
            heading={reforecast ? "Plan run" : undefined}
          />
        </>
      ) : (
        <div className="card text-center" data-testid="no-run">
          <h2>No forecast yet</h2>
          <p className="mx-auto mt-2 max-w-xl text-sm text-muted">
            This scenario has not been run yet, so there is no finish-date forecast to show. The inputs below are the plan as it stands; ask the person who shared
            the link to run it.
          </p>
        </div>
      )}

      <section className="card" aria-labelledby="inputs-heading">
        <h2 id="inputs-heading">Inputs</h2>
        <p className="mt-0.5 text-sm text-muted">The plan the forecast is computed from (current version).</p>
        <div className="mt-3">
          <InputsSummary definition={scenario.definition} />
        </div>
      </section>

    </SharedPageFrame>
  );
}
