import type { Metadata } from "next";
import Link from "next/link";
import { requireScenario } from "@/lib/server/access";
import { orNotFound } from "@/lib/server/page-access";
import { getForecastStandingOn, getLatestPlanRunWithTrace, listProgress } from "@db/queries/progress";
import { againstPlanFor } from "@/lib/against-plan";
import { planForecastText } from "@/lib/plan-of-record-text";
import { parseScenario } from "@sim/validate";
import { formatDateTime, formatIsoDate, formatIsoDay, formatStation } from "@/lib/format";
import { DISCOVERED_LABELS, todayIn } from "@/lib/progress-schema";
import { daySum, neighbourDays, readDay } from "@/lib/daily-report";
import { lastWorkDate, progressToDate } from "@/lib/progress-to-date";
import { ProgressToDate } from "@/components/progress-to-date";
import { PrintButton } from "../../brief/print-button";
import { ShiftCells, ShiftHeads, WeatherAndLostCells } from "../shift-columns";

export const metadata: Metadata = { title: "Daily report" };

const feet = (ft: number) => `${Math.round(ft).toLocaleString("en-US")} ft`;

/**
 * The field log of one day, printable like the owner brief (its fixed width, nothing to click on paper): the shifts
 * worked, the day in sum, the conditions found, and progress to date and the forecast that stood at the end of
 * that day — the record an inspector files and the owner's office reads. `?date=` picks the day (the log's last day by default); the
 * days before and after with shifts are a click away.
 */
export default async function DailyReportPage({ params, searchParams }: { params: Promise<{ scenarioId: string }>; searchParams: Promise<{ date?: string }> }) {
  const { scenarioId } = await params;
  const { date: asked } = await searchParams;
  const { scenario, project } = await orNotFound(requireScenario(scenarioId, "read"));
  const parsed = parseScenario(scenario.definition);
  if (!parsed.ok) return <p className="card text-sm text-bad">The plan has problems, so its field log cannot be read against it. Fix the plan first.</p>;
  const plan = parsed.scenario;
  const entries = await listProgress({ scenarioId });
  const chosen = readDay(asked);
  const day = chosen ?? (lastWorkDate(entries) || todayIn(plan.timeZone));
  const shifts = entries.filter((e) => e.workDate === day);
  const { before, after } = neighbourDays(entries, day);
  const sum = daySum(shifts);
  const names = Object.fromEntries(plan.operations.map((o) => [o.id, o.name]));
  const shiftName = (id: string) => plan.calendar.shifts.find((s) => s.id === id)?.name ?? id;
  const toDate = entries.filter((e) => e.workDate <= day);
  const [standing, planRun] = await Promise.all([getForecastStandingOn({ scenarioId, day, timeZone: plan.timeZone }), getLatestPlanRunWithTrace({ scenarioId })]);
  const rowsToDate = progressToDate(plan, toDate);
  // Against the plan at the end of this day (not of the log's last shift): the day's own standing.
  const against = againstPlanFor({ rows: rowsToDate, run: planRun, plan, toDate: day, formatDate: formatIsoDate, formatDateTime });
  // The project list's words for a forecast, as it read at the end of that day.
  const forecast = standing
    ? planForecastText({ planScenarioId: scenario.id, planName: scenario.name, planRunSummary: standing.summary, planRunAt: standing.createdAt, planRunDataDate: standing.dataDate, planRunStale: null })
    : null;
  const base = `/scenarios/${scenarioId}/progress/daily`;

  return (
    <article className="brief space-y-5" data-testid="daily-report">
      <div className="flex flex-wrap items-end justify-between gap-3 print:hidden">
        <form method="get" action={base} className="flex items-end gap-2">
          <div>
            <label htmlFor="daily-date" className="field-label">
              Day
            </label>
            <input id="daily-date" name="date" type="date" defaultValue={day} className="field-input w-44" required />
          </div>
          <button type="submit" className="btn-secondary">
            Show
          </button>
        </form>
        <PrintButton />
      </div>
      {asked !== undefined && !chosen && (
        <p role="alert" className="rounded-md border border-bad/30 bg-bad-bg px-4 py-2 text-sm print:hidden">
          “{asked.slice(0, 40)}” is not a date; showing {formatIsoDay(day, { long: true })} instead.
        </p>
      )}
      <nav aria-label="Days with shifts" className="flex flex-wrap justify-between gap-x-4 gap-y-1 text-sm print:hidden">
        {before ? <Link href={`${base}?date=${before}`} className="text-brand-700 hover:underline">← {formatIsoDay(before)}</Link> : <span className="text-muted">No earlier shift</span>}
        <Link href={`/scenarios/${scenarioId}/progress`} className="text-brand-700 hover:underline">
          Back to the field log
        </Link>
        {after ? <Link href={`${base}?date=${after}`} className="text-brand-700 hover:underline">{formatIsoDay(after)} →</Link> : <span className="text-muted">No later shift</span>}
      </nav>

      <div className="border-b border-line pb-4">
        <p className="text-sm font-semibold uppercase tracking-widest text-brand-700">Daily report</p>
        <h2 className="mt-1 text-2xl" data-testid="daily-day">{formatIsoDay(day, { long: true })}</h2>
        <p className="text-muted">
          {project.name} · {project.structureName} · scenario “{scenario.name}”
        </p>
      </div>

      {shifts.length === 0 ? (
        <p className="card text-sm" data-testid="daily-none">
          No shift is recorded on {formatIsoDay(day, { long: true })}.
        </p>
      ) : (
        <section className="card space-y-3" aria-labelledby="daily-shifts-heading">
          <h3 id="daily-shifts-heading">Shifts worked</h3>
          <p className="text-sm" data-testid="daily-sum">
            {sum.shifts} shift{sum.shifts === 1 ? "" : "s"}:{" "}
            {[...sum.feetByOperation].map(([op, ft]) => `${names[op] ?? op} ${feet(ft)}`).join(", ")}.{" "}
            {sum.lowF === null ? "No temperature recorded" : sum.lowF === sum.highF ? `${sum.lowF} °F recorded` : `${sum.lowF}–${sum.highF} °F recorded`}
            {sum.rainShifts > 0 ? `; rain on ${sum.rainShifts} of ${sum.shifts} shift${sum.shifts === 1 ? "" : "s"}` : "; no rain"}
            {sum.lostHours > 0 ? `; ${sum.lostHours.toLocaleString("en-US", { maximumFractionDigits: 1 })} hours lost` : "; no hours lost"}
            {sum.conditions > 0 ? `; ${sum.conditions} discovered condition${sum.conditions === 1 ? "" : "s"} (${sum.conditionAreaSqFt.toLocaleString("en-US")} ft²)` : ""}.
          </p>
          {/* On a phone each shift is a card (globals.css stack-on-phone); at the brief's width and on paper, a table. */}
          <div>
            <table className="stack-on-phone w-full text-sm" data-testid="daily-shifts">
              <caption className="sr-only">Shifts worked on {formatIsoDay(day)}</caption>
              <thead>
                <tr className="border-b border-line text-left">
                  <ShiftHeads date={false} />
                  <th scope="col" className="py-2 pr-2">Weather</th>
                  <th scope="col" className="py-2 pr-2">Lost</th>
                  <th scope="col" className="py-2">Recorded by</th>
                </tr>
              </thead>
              <tbody>
                {shifts.map((e) => (
                  <tr key={e.id} className="border-b border-line/60 align-top">
                    <ShiftCells e={e} date={false} shiftName={shiftName} names={names} />
                    <WeatherAndLostCells e={e} />
                    <td className="py-2" data-label="Recorded by">
                      {e.enteredByName}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {sum.conditions > 0 && (
            <div>
              <h4 className="text-sm font-semibold">Conditions found</h4>
              <ul className="mt-1 list-disc pl-5 text-sm" data-testid="daily-conditions">
                {shifts.flatMap((e) =>
                  e.discovered.map((d, i) => (
                    <li key={`${e.id}-${i}`}>
                      {DISCOVERED_LABELS[d.kind as keyof typeof DISCOVERED_LABELS] ?? d.kind}, {formatStation(d.fromStationFt)}–{formatStation(d.toStationFt)}, {d.areaSqFt.toLocaleString("en-US")} ft² ({names[e.operationId] ?? e.operationId}, {shiftName(e.shift).toLowerCase()})
                    </li>
                  )),
                )}
              </ul>
            </div>
          )}
        </section>
      )}

      <section className="card break-inside-avoid" aria-labelledby="daily-forecast-heading" data-testid="daily-forecast">
        <h3 id="daily-forecast-heading">Forecast at the end of the day</h3>
        {forecast ? (
          <>
            <p className="mt-1 text-sm">
              P80 finish <strong>{forecast.p80}</strong>
              {forecast.rest}
            </p>
            <p className="mt-0.5 text-xs text-muted">{forecast.when}</p>
          </>
        ) : (
          <p className="mt-1 text-sm text-muted">No forecast of this scenario had been run by then.</p>
        )}
      </section>

      {toDate.length > 0 && (
        <section className="card break-inside-avoid" aria-labelledby="daily-to-date-heading">
          <h3 id="daily-to-date-heading">Progress to date</h3>
          <p className="mt-1 mb-2 text-sm text-muted">At the end of {formatIsoDay(day)}, from every shift recorded up to then.</p>
          <ProgressToDate rows={rowsToDate} document against={against ?? undefined} />
        </section>
      )}
    </article>
  );
}
