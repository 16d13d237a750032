import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { getLatestRun } from "@db/queries/runs";
import { getProject } from "@db/queries/projects";
import type { RunSummary } from "@sim/index";
import { ResultsView } from "@/components/results";
import { BriefTraffic } from "@/components/results/brief-traffic";
import { SafetyNote } from "@/components/safety-note";
import { formatDateTime, formatIsoDate, formatPercent, formatStation } from "@/lib/format";
import { stageSentence } from "@/lib/stage-text";
import { PrintButton } from "./print-button";
import { orNotFound } from "@/lib/server/page-access";
import { resultsRunOf, type RunHeadline } from "@/lib/run-record";
import { iterationsStatement } from "@/components/results/summary-text";
import { VerificationBadge } from "@/components/results/verification-badge";
import { getNewestReforecastHeadline, listProgress } from "@db/queries/progress";
import { ProgressToDate } from "@/components/progress-to-date";
import { lastWorkDate, progressToDate } from "@/lib/progress-to-date";
import { againstPlanFor } from "@/lib/against-plan";
import { ReforecastNotice } from "@/components/results/reforecast-notice";
import { olderRulesText } from "@/lib/model-rules-text";

export const metadata: Metadata = { title: "Owner brief" };

const DAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"];
const hour = (h: number) => `${String(Math.floor(h)).padStart(2, "0")}:${String(Math.round((h % 1) * 60)).padStart(2, "0")}`;

/**
 * A printable one-document summary for the owner: the answer first, then the evidence (with the traffic
 * section: closure plan, backups, days over the queue limit, the holiday trade-off), then the assumptions.
 * Laid out at a fixed width that fits the printable width of both Letter and A4 (globals.css, `.brief`), so the
 * charts print whole; nothing on it can be clicked. tests/e2e/brief-print.test.ts prints it to PDF and checks it.
 */
export default async function BriefPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await orNotFound(requireScenario(scenarioId, "read"));
  const [run, project, reforecast, entries] = await Promise.all([
    getLatestRun({ scenarioId }),
    getProject({ id: scenario.projectId }),
    getNewestReforecastHeadline({ scenarioId }),
    listProgress({ scenarioId }),
  ]);
  const d = validateDefinition(scenario.definition);
  const s = run?.results as unknown as RunSummary | undefined;
  const progressRows = progressToDate(d, entries);
  // The answer tiles are the forecast the project stands on: the newest re-forecast whenever there is one, however
  // recent the plan run (runs.ts `forecastOrder`) — an executive quotes the big figures, not the notice above them —
  // else the plan run's own.
  const reforecastHead = reforecast && (reforecast.summary as Partial<RunHeadline>).finish ? (reforecast.summary as unknown as RunHeadline) : null;
  const against = run && againstPlanFor({ rows: progressRows, run: { trace: s?.representative.trace, stale: run.stale, createdAt: run.createdAt }, plan: d, toDate: lastWorkDate(entries), formatDate: formatIsoDate, formatDateTime });
  return (
    <article className="brief space-y-6" data-testid="owner-brief">
      <div className="flex items-start justify-between gap-4 print:hidden">
        <p className="text-sm text-muted">A print-ready brief of this scenario&apos;s latest forecast. Use your browser&apos;s print dialog to save it as PDF.</p>
        <PrintButton />
      </div>
      <div className="border-b border-line pb-4">
        <p className="text-sm font-semibold uppercase tracking-widest text-brand-700">Owner brief</p>
        <h2 className="mt-1 text-2xl">{project?.name}</h2>
        <p className="text-muted">
          {project?.structureName} · scenario “{scenario.name}” (version {scenario.version}, saved {formatDateTime(scenario.updatedAt)} by {scenario.updatedByName})
        </p>
      </div>
      {/* Its "below is the plan as run" is said before the plan run itself, since the answer tiles between are the re-forecast's. */}
      {reforecast && <ReforecastNotice scenarioId={scenario.id} reforecast={reforecast} shownRunAt={reforecastHead ? null : (run?.createdAt ?? null)} document />}
      {entries.length > 0 && (
        <section aria-labelledby="to-date-heading" className="card break-inside-avoid" data-testid="brief-progress">
          <h3 id="to-date-heading">Progress to date</h3>
          <p className="mt-1 mb-2 text-sm text-muted">From the field log, up to its last shift ({formatIsoDate(lastWorkDate(entries))}).</p>
          <ProgressToDate rows={progressRows} document against={against ?? undefined} />
        </section>
      )}
      {!s || !run ? (
        <p className="card">This scenario has not been run yet: there is no forecast to brief.</p>
      ) : (
        <>
          {reforecastHead && reforecast ? (
            <AnswerTiles
              heading={`Finish dates re-forecast from the field log as of ${reforecast.dataDate ? formatIsoDate(reforecast.dataDate) : "its data date"} (${reforecastHead.iterations.toLocaleString("en-US")} iterations, run ${formatDateTime(reforecast.createdAt)})`}
              finish={reforecastHead.finish}
              target={reforecastHead.targetDate && reforecastHead.targetProbability !== null ? { date: reforecastHead.targetDate, probability: reforecastHead.targetProbability } : null}
            />
          ) : (
            <AnswerTiles finish={s.finish} target={s.target ?? null} />
          )}
          {run.stale && (
            <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm">This {reforecastHead ? "plan run" : "forecast"} was computed from version {run.scenarioVersion}; the plan has changed since.</p>
          )}
          {run.olderRules && (
            <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" data-testid="brief-older-rules">
              {olderRulesText(reforecastHead ? "This plan run" : "This forecast", run.modelRevision)}
            </p>
          )}
          <p className="text-sm" data-testid="brief-iterations">
            <VerificationBadge verification={run.verification} /> {reforecastHead ? "Below is the plan run, which knows nothing of the work done since. " : ""}
            {iterationsStatement(s).text} Monte Carlo forecast, seed “{run.seed}”, computed {formatDateTime(run.createdAt)}. P80 means 80 % of the simulated outcomes
            finished on or before that date, given the assumptions below.
          </p>
          {iterationsStatement(s).warning && (
            <p className="rounded-md border-2 border-warn bg-warn-bg px-4 py-2 text-sm font-medium" role="note" data-testid="brief-iterations-warning">
              {iterationsStatement(s).warning}
            </p>
          )}
          <ResultsView summary={s} definition={scenario.definition} run={resultsRunOf(run)} document heading={reforecast ? "Plan run" : undefined} />
          <BriefTraffic plan={d} summary={s} seed={run.seed} iterations={run.iterations} />
        </>
      )}
      <section aria-labelledby="assumptions-heading" className="card break-inside-avoid">
        <h3 id="assumptions-heading">Assumptions</h3>
        <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
          <li>
            Deck {d.deck.lengthFt.toLocaleString("en-US")} ft from {formatStation(d.deck.startStationFt)}, lanes {d.deck.lanes.join(", ")}, worked in {d.deck.packetFt} ft packets; work starts{" "}
            {formatIsoDate(d.startDate)}.
          </li>
          <li>
            Season plan: {d.calendar.season.plan === "two" ? "two seasons" : "one season"}; winter stand-down {d.calendar.season.winterStart} to {d.calendar.season.winterEnd}
            {d.calendar.season.cutoffDate ? `, season 1 stops ${formatIsoDate(d.calendar.season.cutoffDate)}` : ""}
            {d.calendar.season.cutoffStationFt !== undefined ? `, season 1 stops at ${formatStation(d.calendar.season.cutoffStationFt)}` : ""}.
          </li>
          <li>
            Holidays:{" "}
            {d.calendar.holidays.policy === "standDown"
              ? `crews stand down from ${hour(d.calendar.holidays.standDownStartHour)} the day before each federal holiday through the holiday weekend${d.calendar.holidays.standDownThroughMonday ? " and the Monday after" : ""}`
              : "work continues through holidays"}
            .
          </li>
          <li>Work days: {d.calendar.workDays.map((w) => DAYS[w]).join(", ")}; shifts: {d.calendar.shifts.map((sh) => `${sh.name} ${hour(sh.startHour)} for ${sh.lengthHours} h`).join("; ")}.</li>
          {d.stages.map((_, i) => (
            <li key={`stage-${i}`}>{stageSentence(d, i)}</li>
          ))}
          <li>
            Short-term lane closures (while a crew works):{" "}
            {d.calendar.closures
              .map((c) => `${c.name} (${c.lanesClosed.join(", ")}${c.setupHours || c.takedownHours ? `; ${c.setupHours} h set-up, ${c.takedownHours} h take-down` : ""}) ${d.calendar.closureWindows.filter((w) => w.closure === c.id).map((w) => `${w.dayTypes.join("/")} ${hour(w.startHour)}–${hour(w.endHour)}`).join(", ")}`)
              .join("; ") || "none"}
            .
          </li>
          {d.operations.map((o) =>
            o.kind === "crew" ? (
              <li key={o.id}>
                {o.name}: {o.crews} crew{o.crews > 1 ? "s" : ""}, rate {o.rate.dist.type === "fixed" ? o.rate.dist.value : o.rate.dist.type === "lognormal" ? `median ${o.rate.dist.median}` : `${o.rate.dist.min}–${o.rate.dist.max} (most likely ${o.rate.dist.mode})`}{" "}
                {o.rate.unit === "ftPerShift" ? "ft per shift" : "ft per hour"}
                {o.gates.minTempF !== undefined ? `, needs ≥ ${o.gates.minTempF} °F${o.gates.rising ? " and rising" : ""}` : ""}
                {o.gates.noRain ? ", no rain" : ""}
                {o.gates.noRainHoursAfter ? ` and ${o.gates.noRainHoursAfter} h dry after` : ""}
                {o.gates.maxEvaporation !== undefined ? `, evaporation ≤ ${o.gates.maxEvaporation} lb/ft²/h` : ""}
                {o.gates.maxTempF !== undefined ? `, at most ${o.gates.maxTempF} °F` : ""}
                {o.gates.protectAfter?.minTempF !== undefined && o.gates.protectAfter.hours ? `, air ≥ ${o.gates.protectAfter.minTempF} °F for ${o.gates.protectAfter.hours} h after` : ""}.
              </li>
            ) : (
              <li key={o.id}>
                {o.name}: a timed wait ({o.durationHours.type === "fixed" ? `${o.durationHours.value} h` : "a distribution of hours"}
                {o.countAboveF !== undefined ? `, counting only hours at or above ${o.countAboveF} °F` : ""}).
              </li>
            ),
          )}
          <li>
            Weather: {d.weather.mode === "stochastic" ? "simulated daily from a monthly climate profile (wet/dry Markov chain, correlated temperatures)" : "fixed monthly normals"}; deeper deterioration found in{" "}
            {formatPercent(d.discovered.defaultProbability)} of packets by default{d.deck.survey.length ? `, per the deck survey in ${d.deck.survey.length} ranges` : ""}.
          </li>
        </ul>
      </section>
      <SafetyNote />
    </article>
  );
}

/** The brief's answer: P50, P80 and P90 finish and the chance of the target; `heading` shown when given (else "Finish dates" for screen readers only). */
function AnswerTiles({ heading, finish, target }: { heading?: string; finish: { p50: string; p80: string; p90: string }; target: { date: string; probability: number } | null }) {
  return (
    <section aria-labelledby="answer-heading" className="grid gap-3 sm:grid-cols-4" data-testid="brief-answer">
      <h3 id="answer-heading" className={heading ? "text-sm font-semibold sm:col-span-4" : "sr-only"}>
        {heading ?? "Finish dates"}
      </h3>
      {(["p50", "p80", "p90"] as const).map((k) => (
        <div key={k} className="card">
          <p className="text-xs font-semibold uppercase text-muted">{k.toUpperCase()} finish</p>
          <p className="mt-1 text-xl font-semibold">{formatIsoDate(finish[k])}</p>
        </div>
      ))}
      <div className="card">
        <p className="text-xs font-semibold uppercase text-muted">Target {target ? formatIsoDate(target.date) : "—"}</p>
        <p className="mt-1 text-xl font-semibold">{target ? `${formatPercent(target.probability)} chance` : "no target set"}</p>
      </div>
    </section>
  );
}
