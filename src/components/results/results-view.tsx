"use client";
/**
 * The results of one run, as the Outlook page and the public shared page show them: the plain-language
 * summary, figures, the confidence curve and histogram, the time–distance chart of the representative
 * iteration and the per-operation table. Reads only its props (no fetching), so it renders anywhere.
 * `document`: the owner brief's layout — one column (charts as wide as the page), and nothing to click (no
 * sorting, no trade-off button), because it is printed.
 */
import { memo, useEffect, useMemo, type ReactNode } from "react";
import { mark, RUN_MARKS } from "@workers/run-marks";
import { parseScenario } from "@sim/validate";
import { queueLimitOf } from "@sim/queue-limit";
import type { RunSummary } from "@sim/summary";
import { useJsonStable } from "../use-json-stable";
import { ChartPlaceholder } from "./chart-placeholder";
import { ConfidencePanel } from "./confidence-panel";
import { DelayPanel } from "./delay-panel";
import { QueueBreachDays } from "./queue-breach-days";
import { FinishHistogram } from "./finish-histogram";
import { OperationsTable } from "./operations-table";
import { StatCards } from "./stat-cards";
import { p80Meaning, plainSummary, quantileText, winterCarryover } from "./summary-text";
import { TimeDistanceChart } from "./time-distance-chart";
import { TradeoffPanel } from "./tradeoff-panel";
import { useStaged } from "./use-staged";

// Redrawn only when their own props change (a summary or plan object they have not drawn yet).
const Confidence = memo(ConfidencePanel);
const Histogram = memo(FinishHistogram);
const TimeDistance = memo(TimeDistanceChart);
const Delay = memo(DelayPanel);
const Stats = memo(StatCards);
const Breaches = memo(QueueBreachDays);
const Operations = memo(OperationsTable);

export interface ResultsRun {
  id: string;
  iterations: number;
  seed: string;
  createdAt: string;
  createdByName: string;
  stale: boolean;
}

function Section({ title, id, children, description }: { title: string; id: string; children: React.ReactNode; description?: string }) {
  return (
    <section className="card" aria-labelledby={id}>
      <h2 id={id}>{title}</h2>
      {description && <p className="mt-0.5 text-sm text-muted">{description}</p>}
      <div className="mt-3">{children}</div>
    </section>
  );
}

/** `heading`: "Forecast", or "Plan run" where a re-forecast from the field log is the forecast (said above it). */
export function ResultsView({
  summary,
  definition: given,
  run,
  document = false,
  heading = "Forecast",
  tradeoffNote,
}: {
  summary: RunSummary;
  definition: unknown;
  run: ResultsRun;
  document?: boolean;
  heading?: string;
  /** Said under the holiday trade-off: on a job under way, that it weighs the whole plan, and where to weigh the rest. */
  tradeoffNote?: ReactNode;
}) {
  // A page refresh brings the same plan as a new object: keep the one already parsed and drawn.
  const definition = useJsonStable(given);
  const plan = useMemo(() => {
    const r = parseScenario(definition);
    return r.ok ? r.scenario : null;
  }, [definition]);
  // The charts take a new summary in three tasks (the printed brief draws them at once): the confidence curve and
  // the histogram together — each a few hundred shapes at most — then the time–distance chart, then the delay chart.
  // A stage costs a frame or two of waiting, so fewer stages draw sooner while each task stays under the Long
  // Tasks limit (npm run bench -- --browser).
  const queueLimit = useMemo(() => queueLimitOf(plan), [plan]);
  const [firstOf, tdOf, delayOf] = useStaged(summary, 3, !document);
  const curveOf = firstOf;
  const histogramOf = firstOf;
  const text = plainSummary(summary);
  const allUnfinished = summary.unfinishedIterations >= summary.iterations;
  const idp = `run-${run.id}`;
  // On the page's timeline, for profiles and the browser benchmark: every chart of this summary is committed.
  const allDrawn = [curveOf, histogramOf, tdOf, delayOf].every((s) => s === summary);
  useEffect(() => {
    if (allDrawn) mark(RUN_MARKS.drawn, { seed: run.seed, iterations: summary.iterations });
  }, [allDrawn, summary, run.seed]);

  return (
    <div className="space-y-5" data-testid="results-view" data-run-seed={run.seed} data-run-iterations={summary.iterations}>
      <section className="card" aria-labelledby={`${idp}-summary`}>
        <div className="flex flex-wrap items-center gap-2">
          <h2 id={`${idp}-summary`}>{heading}</h2>
          {run.stale && (
            <span className="badge bg-warn-bg text-warn" data-testid="stale-badge" title="The scenario changed after this run">
              Stale — plan changed since this run
            </span>
          )}
          <span className="text-xs text-muted">
            {summary.iterations.toLocaleString("en-US")} iterations · seed “{run.seed}”
          </span>
        </div>
        <p className="mt-2 text-lg leading-relaxed" data-testid="plain-summary">
          P80 finish <strong data-testid="p80-date">{text.p80}</strong>
          {text.targetClause}.
        </p>
        <p className="mt-1 text-sm" data-testid="p80-meaning">{p80Meaning(summary)}</p>
        <p className="mt-1 text-sm text-muted">{text.percentiles}</p>
        {text.season1 && <p className="mt-1 text-sm">{text.season1}</p>}
        {text.stages.length > 0 && (
          <ul className="mt-2 space-y-0.5 text-sm" data-testid="stage-finishes" aria-label="Finish by stage">
            {text.stages.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        )}
        {text.laneClosed && (
          <p className="mt-1 text-sm" data-testid="lane-closed-hours">
            {text.laneClosed}
          </p>
        )}
        {plan && winterCarryover(summary, plan) && (
          <p className="mt-1 text-sm" data-testid="winter-carryover">
            {winterCarryover(summary, plan)}
          </p>
        )}
        {text.unfinished && (
          <p className="mt-3 rounded-md border border-warn/30 bg-warn-bg px-3 py-2 text-sm" role="status" data-testid="unfinished-warning">
            <span className="font-semibold text-warn">Unfinished iterations: </span>
            {text.unfinished}
          </p>
        )}
        <p className="mt-2 flex items-start gap-2 text-sm" data-testid="convergence">
          <span
            className={`badge shrink-0 ${text.convergence.stable === true ? "bg-brand-50 text-ok" : text.convergence.stable === false ? "bg-warn-bg text-warn" : "border border-line text-muted"}`}
          >
            {text.convergence.stable === true ? "Stable" : text.convergence.stable === false ? "Not yet stable" : "Not measured"}
          </span>
          <span>{text.convergence.text}</span>
        </p>
      </section>

      <Stats summary={summary} />

      <div className={document ? "grid gap-5" : "grid gap-5 lg:grid-cols-2"}>
        <Section title="Confidence curve" id={`${idp}-curve`} description="Share of iterations finished by each date; dots mark P50, P80 and P90.">
          {curveOf ? <Confidence summary={curveOf} /> : <ChartPlaceholder height={300} />}
        </Section>
        <Section title="Finish dates" id={`${idp}-hist`} description="How many iterations finished in each period.">
          {histogramOf ? <Histogram summary={histogramOf} /> : <ChartPlaceholder height={240} />}
        </Section>
      </div>

      <Section
        title="Time–distance"
        id={`${idp}-td`}
        description={`The iteration whose finish is nearest the P50 (finish ${summary.representative ? quantileText(summary.representative.finish) : "—"}): where each operation is on the deck over time${(summary.stages?.length ?? 0) > 1 ? ", stage by stage" : ""}, and what is closed.`}
      >
        <div data-testid="time-distance-chart">
          {allUnfinished && summary.representative?.trace?.packets?.length === 0 ? (
            <p className="text-sm text-muted">No iteration finished, so there is no representative iteration to draw.</p>
          ) : (
            tdOf ? <TimeDistance summary={tdOf} plan={plan} stale={run.stale} /> : <ChartPlaceholder height={460} />
          )}
        </div>
      </Section>

      <Section
        title="Delay and cost"
        id={`${idp}-delay`}
        description="What the plan costs drivers and the owner (P50 and P80 over iterations), and, for the iteration nearest the P50, lane-closed hours and the longest queue of each day."
      >
        <Delay summary={summary} chartOf={delayOf} />
        {/* The printed brief lists the days over the limit in its own traffic section. */}
        {!document && <Breaches summary={summary} limit={queueLimit} />}
      </Section>

      {plan && !document && (
        <Section title="Holiday trade-off" id={`${idp}-tradeoff`} description="Days gained by working through federal holidays against the extra delay to drivers, on the same seeds.">
          {tradeoffNote && (
            <p className="mb-3 text-sm" data-testid="tradeoff-note">
              {tradeoffNote}
            </p>
          )}
          <TradeoffPanel definition={definition} seed={run.seed} iterations={run.iterations} />
        </Section>
      )}

      <Section title={(summary.stages?.length ?? 0) > 1 ? "Finish by stage and operation" : "Finish by operation"} id={`${idp}-ops`}>
        <Operations operations={summary.operations} stages={summary.stages} sortable={!document} />
      </Section>
    </div>
  );
}
