import type { Metadata } from "next";
import Link from "next/link";
import { requireScenario } from "@/lib/server/access";
import { getLatestPlanRunWithTrace, getLatestReforecast, listDeletedProgress, listProgress, listReforecastRuns } from "@db/queries/progress";
import { getLatestRun } from "@db/queries/runs";
import { can } from "@/lib/permissions";
import { formatDateTime, formatHour, formatIsoDate } from "@/lib/format";
import { todayIn } from "@/lib/progress-schema";
import { parseScenario } from "@sim/validate";
import { parseIsoDate } from "@sim/dates";
import type { RunSummary } from "@sim/summary";
import type { Scenario } from "@sim/schema";
import { TimeDistanceChart, type ActualSeries } from "@/components/results/time-distance-chart";
import { DriftChart, type DriftPoint } from "./drift-chart";
import { ProgressForm, type PlanFacts } from "./progress-form";
import { ImportShifts } from "./import-shifts";
import { lastRecorded } from "./entry-defaults";
import { ProgressTable, type EntryView } from "./progress-table";
import { ReforecastPanel } from "./reforecast-panel";
import { BehindFieldNotice } from "./behind-field-notice";
import { DeletedShifts } from "./deleted-shifts";
import { ProgressToDate } from "@/components/progress-to-date";
import { lastWorkDate, progressToDate } from "@/lib/progress-to-date";
import { againstPlanFor } from "@/lib/against-plan";
import { orNotFound } from "@/lib/server/page-access";
import { MAX_AGE_HOURS } from "@/lib/server/forecast/reforecast-input";
import { forecastSourceSentence } from "@/lib/reforecast-weather-text";
import { runMadeText } from "@/lib/plan-of-record-text";

export const metadata: Metadata = { title: "Field log" };

/** Recorded shifts as thick segments per operation: (shift start, from) → (shift end, to), a gap between shifts. */
function actualsOf(plan: Scenario, entries: EntryView[]): ActualSeries[] {
  return plan.operations
    .map((op) => {
      const points: ActualSeries["points"] = [];
      const mine = entries.filter((e) => e.operationId === op.id);
      const timed = mine
        .map((e) => {
          const sh = plan.calendar.shifts.find((s) => s.id === e.shift);
          const start = parseIsoDate(e.workDate) + (sh?.startHour ?? 0) / 24;
          return { e, start, end: start + (sh?.lengthHours ?? 0) / 24 };
        })
        .sort((a, b) => a.start - b.start);
      for (const t of timed) points.push({ x: t.start, y: t.e.fromStationFt }, { x: t.end, y: t.e.toStationFt }, { x: t.end, y: null });
      return { id: op.id, points };
    })
    .filter((a) => a.points.length > 0);
}

export default async function FieldLogPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario, role, archived, project } = await orNotFound(requireScenario(scenarioId, "read"));
  const parsed = parseScenario(scenario.definition);
  if (!parsed.ok) return <p className="card text-sm text-bad">The plan has problems, so progress cannot be checked against it. Fix the plan first.</p>;
  const plan = parsed.scenario;
  // One read of the newest plan run: the drift chart's first point and the trace progress is compared with.
  const [rows, deleted, drift, planRun, latestRe] = await Promise.all([
    listProgress({ scenarioId }),
    listDeletedProgress({ scenarioId }),
    listReforecastRuns({ scenarioId }),
    getLatestPlanRunWithTrace({ scenarioId }),
    getLatestReforecast({ scenarioId }),
  ]);
  const chartRun = latestRe ? { results: latestRe.results, stale: latestRe.stale, dataDate: latestRe.dataDate } : await getLatestRun({ scenarioId }).then((r) => r && { results: r.results, stale: r.stale, dataDate: null });
  const entries: EntryView[] = rows.map((r) => ({ ...r, enteredByName: r.enteredByName ?? "" }));
  const canRecord = can(role, "recordProgress", archived);
  const canRun = can(role, "runScenario", archived);
  const crewOps = plan.operations.filter((o) => o.kind === "crew");
  const recorded = lastRecorded(entries, (id) => plan.calendar.shifts.find((s) => s.id === id)?.startHour ?? 0);
  const facts: PlanFacts = {
    startDate: plan.startDate,
    today: todayIn(plan.timeZone),
    deckFrom: plan.deck.startStationFt,
    deckTo: plan.deck.startStationFt + plan.deck.lengthFt,
    shifts: plan.calendar.shifts.map((s) => ({ id: s.id, name: s.name })),
    operations: crewOps.map((o) => ({ id: o.id, name: o.name, shifts: o.shifts, lastToFt: recorded.lastToFt.get(o.id) ?? null })),
    lastOperationId: recorded.lastOperationId,
  };
  const names = Object.fromEntries(plan.operations.map((o) => [o.id, o.name]));
  const shiftName = (id: string) => plan.calendar.shifts.find((s) => s.id === id)?.name ?? id;
  const lastDate = lastWorkDate(entries);
  const points: DriftPoint[] = [
    ...(planRun ? [{ label: "Plan", made: runMadeText({ at: planRun.createdAt, byName: null, automatic: false }), ...((planRun.summary as { finish: { p50: string; p80: string } }).finish) }] : []),
    ...drift.map((r) => ({
      label: formatIsoDate(r.dataDate),
      // Two re-forecasts of one data date (a shift recorded later that day) are told apart by when they were run.
      made: runMadeText({ at: r.createdAt, byName: r.createdByName, automatic: r.automatic }),
      ...((r.summary as { finish: { p50: string; p80: string } }).finish),
    })),
  ];
  type Digest = { entriesUsed: number; discovery: { inspected: number; found: number; planMean: number; updatedMean: number }; weatherForecast?: { fetchedAt: string } };
  const latestResults = latestRe ? (latestRe.results as { reforecast?: Digest; forecastDates?: string[] }) : undefined;
  const digest = latestResults?.reforecast;
  const progressRows = progressToDate(plan, entries);
  const against = againstPlanFor({ rows: progressRows, run: planRun, plan, toDate: lastDate, formatDate: formatIsoDate, formatDateTime });

  return (
    <div className="space-y-5">
      {canRecord && (
        <section className="card" aria-labelledby="record-heading">
          <h2 id="record-heading">Record a shift</h2>
          <p className="mt-1 text-sm text-muted">What was completed this shift, the weather seen, hours lost and any deeper deterioration found.</p>
          <div className="mt-4">
            <ProgressForm scenarioId={scenario.id} facts={facts} />
          </div>
          <ImportShifts scenarioId={scenario.id} />
        </section>
      )}
      {entries.length > 0 && (
        <section className="card" aria-labelledby="to-date-heading">
          <h2 id="to-date-heading">Progress to date</h2>
          <p className="mt-1 mb-3 text-sm text-muted">
            From the field log, up to its last shift ({formatIsoDate(lastDate)}): the feet each operation has done of the feet it has to do{plan.stages && plan.stages.length > 1 ? " over every stage" : ""}, as a re-forecast counts them.
          </p>
          <ProgressToDate rows={progressRows} against={against ?? undefined} />
          {!against && <p className="mt-2 text-xs text-muted">{planRun ? "The plan changed since its last run, so progress is not compared with it: run the plan on the Outlook to compare." : "The plan has not been run, so progress is not compared with it: run it on the Outlook to compare."}</p>}
        </section>
      )}
      <section className="card" aria-labelledby="log-heading">
        <h2 id="log-heading">Field log</h2>
        <div className="mt-1 mb-3 flex flex-wrap items-center justify-between gap-2">
          <p className="text-sm text-muted">{entries.length.toLocaleString("en-US")} shift{entries.length === 1 ? "" : "s"} recorded.</p>
          {entries.length > 0 && (
            <div className="flex flex-wrap gap-2">
              <Link className="btn-secondary" href={`/scenarios/${scenario.id}/progress/daily`} data-testid="daily-report-link">
                Daily reports
              </Link>
              <a className="btn-secondary" href={`/api/scenarios/${scenario.id}/exports/field-log.csv`} download data-testid="field-log-csv">
                Download the field log (CSV)
              </a>
            </div>
          )}
        </div>
        <ProgressTable scenarioId={scenario.id} entries={entries} facts={facts} canRecord={canRecord} names={names} />
        <DeletedShifts rows={deleted} shiftName={shiftName} names={names} canRecord={canRecord} csvHref={`/api/scenarios/${scenario.id}/exports/field-log.csv?deleted=include`} />
      </section>
      <section className="card space-y-4" aria-labelledby="drift-heading">
        <h2 id="drift-heading">Re-forecast and drift</h2>
        <p className="text-sm text-muted">
          A re-forecast starts from what is built at the data date — done work keeps its recorded time, cures continue, crews already on site stay mobilized — and
          simulates the rest. The discovered-condition rate seen so far updates the risk for the rest of the deck (a beta-binomial update: the survey counts as much
          as 20 inspected packets). When the data date is today and the project has a recent weather forecast (see Week ahead), the first days come from that
          forecast — each hour&apos;s chance of rain decides, iteration by iteration, whether it rains — and the climate profile takes over after them.
        </p>
        {project.planScenarioId === scenario.id && project.dailyReforecastHour !== null && !archived && (
          <p className="text-sm" data-testid="daily-reforecast-note">
            This scenario is the project&apos;s plan of record, re-forecast each morning after {formatHour(project.dailyReforecastHour)} (the plan&apos;s time zone) from the field log as of the day before, whenever the log or the plan changed; the project page says what the last morning decided.
          </p>
        )}
        {canRun && <ReforecastPanel scenarioId={scenario.id} defaultDate={lastDate || plan.startDate} minDate={plan.startDate} maxDate={facts.today} />}
        <BehindFieldNotice shiftsNotIn={latestRe?.shiftsNotIn ?? null} dataDate={latestRe?.dataDate ?? null} shiftsRecorded={entries.length} whoCanRun={canRun ? "you" : archived ? "nobody" : "others"} />
        {digest && (
          <p className="text-sm" data-testid="reforecast-digest">
            Latest re-forecast from {formatIsoDate(latestRe!.dataDate)}: {digest.entriesUsed.toLocaleString("en-US")} shift{digest.entriesUsed === 1 ? "" : "s"} used;{" "}
            {digest.discovery.inspected === 0
              ? `no packet inspected yet, so the plan's mean discovery probability (${(digest.discovery.planMean * 100).toFixed(1)} %) stands.`
              : `${digest.discovery.found} of ${digest.discovery.inspected} inspected packets had discovered conditions, so the mean discovery probability moved from ${(digest.discovery.planMean * 100).toFixed(1)} % to ${(digest.discovery.updatedMean * 100).toFixed(1)} %.`}
          </p>
        )}
        {digest && (
          <p className="text-sm" data-testid="reforecast-weather">
            {forecastSourceSentence({ forecastDates: latestResults?.forecastDates, fetchedAt: digest.weatherForecast?.fetchedAt, timeZone: plan.timeZone, maxAgeHours: MAX_AGE_HOURS })}
          </p>
        )}
        {points.length > 0 ? <DriftChart points={points} /> : <p className="text-sm text-muted">No forecasts yet: run the plan on the Outlook tab, then re-forecast here.</p>}
      </section>
      {chartRun && (
        <section className="card" aria-labelledby="td-heading">
          <h2 id="td-heading">{chartRun.dataDate ? `Time–distance: recorded progress and the re-forecast from ${formatIsoDate(chartRun.dataDate)}` : "Time–distance: recorded progress over the plan"}</h2>
          <div className="mt-3">
            <TimeDistanceChart
              summary={chartRun.results as unknown as RunSummary}
              plan={plan}
              stale={chartRun.stale}
              actuals={actualsOf(plan, entries)}
              dataDay={chartRun.dataDate ? parseIsoDate(chartRun.dataDate) + 1 : undefined}
            />
          </div>
        </section>
      )}
    </div>
  );
}
