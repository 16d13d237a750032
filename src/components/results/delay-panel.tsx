"use client";
/**
 * What a run costs the public and the owner: delay and cost totals (P50/P80 over iterations) and, for the
 * representative iteration, a day-by-day chart of lane-closed hours (bars) and the day's longest queue in miles
 * (line), with the same figures as a table for screen readers. Reads only `summary.delay`, `summary.cost`
 * and `summary.traffic` (absent when the scenario has no traffic or costs section: the panel says so).
 */
import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { NumberQuantiles, RunSummary } from "@sim/summary";
import { formatIsoDate } from "@/lib/format";
import { AXIS_TICK, GRID_STROKE } from "./chart-style";

const num = (v: number | null | undefined, digits = 0) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toLocaleString("en-US", { maximumFractionDigits: digits }));
const money = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : `$${Math.round(v).toLocaleString("en-US")}`);

function Pair({ q, format, unit = "" }: { q: NumberQuantiles | null | undefined; format: (v: number | null) => string; unit?: string }) {
  if (!q) return <p className="text-sm text-muted">Not computed (no input for it in the plan).</p>;
  return (
    <p>
      <span className="text-xl font-semibold">{format(q.p50)}{unit}</span> <span className="text-sm">P50</span>
      <span className="mx-2 text-muted">·</span>
      <span className="text-xl font-semibold">{format(q.p80)}{unit}</span> <span className="text-sm">P80</span>
    </p>
  );
}

export function DelayTotals({ summary }: { summary: RunSummary }) {
  const year = summary.cost?.valueOfTimeYear;
  return (
    <div className="grid gap-3 sm:grid-cols-3" data-testid="delay-totals">
      <div className="rounded-md border border-line bg-paper/60 px-4 py-3" data-testid="delay-vehicle-hours">
        <h3 className="text-sm font-semibold text-muted">Delay to drivers</h3>
        <div className="mt-1">
          <Pair q={summary.delay?.vehicleHours} format={(v) => num(v)} unit=" veh-h" />
        </div>
        <p className="mt-1 text-xs text-muted">Vehicle-hours spent in work-zone queues (D/D/1 queuing over the hours lanes are closed).</p>
      </div>
      <div className="rounded-md border border-line bg-paper/60 px-4 py-3" data-testid="cost-road-user">
        <h3 className="text-sm font-semibold text-muted">Road-user cost</h3>
        <div className="mt-1">
          <Pair q={summary.cost?.roadUser} format={money} />
        </div>
        <p className="mt-1 text-xs text-muted">Delay × value of time for cars and trucks{year ? `, ${year} dollars` : ""}.</p>
      </div>
      <div className="rounded-md border border-line bg-paper/60 px-4 py-3" data-testid="cost-contract">
        <h3 className="text-sm font-semibold text-muted">Contract cost</h3>
        <div className="mt-1">
          <Pair q={summary.cost?.contract} format={money} />
        </div>
        <p className="mt-1 text-xs text-muted">Field days, mobilization per season, winter protection and any incentive or disincentive.</p>
      </div>
    </div>
  );
}

export function DelayChart({ summary }: { summary: RunSummary }) {
  const t = summary.traffic;
  if (!t) return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">This plan has no traffic profile, so there are no queues to draw. Add one in the plan editor’s Traffic section.</p>;
  if (t.days.length === 0) return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">The representative iteration used no closure.</p>;
  const data = t.days.map((d) => ({
    date: d.date,
    short: formatIsoDate(d.date),
    hours: Math.round(Object.values(d.laneClosedHours ?? {}).reduce((a, b) => a + b, 0) * 10) / 10,
    miles: d.peakQueueMiles,
  }));
  const max = t.maxQueue;
  const aria = `Day-by-day chart for the representative iteration (${data.length} days with a closure or a queue): bars are lane-closed hours, the line is the day’s longest queue in miles${max ? `; the longest is ${max.miles} miles on ${formatIsoDate(max.date)}` : ""}. The same figures are in the table that follows.`;
  return (
    <figure aria-label={aria} className="m-0" data-testid="delay-chart">
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={260} initialDimension={{ width: 700, height: 260 }}>
          <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 28, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" vertical={false} />
            <XAxis dataKey="short" tick={AXIS_TICK} interval="preserveStartEnd" minTickGap={32} label={{ value: "Date", position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }} />
            <YAxis yAxisId="h" tick={AXIS_TICK} width={48} label={{ value: "Lane-closed hours", angle: -90, position: "insideLeft", dy: 40, fill: "var(--color-ink)", fontSize: 12 }} />
            <YAxis yAxisId="mi" orientation="right" tick={AXIS_TICK} width={48} label={{ value: "Longest queue (mi)", angle: 90, position: "insideRight", dy: -50, fill: "var(--color-ink)", fontSize: 12 }} />
            <Tooltip />
            <Legend verticalAlign="top" height={28} />
            <Bar yAxisId="h" dataKey="hours" name="Lane-closed hours" fill="var(--color-s2)" isAnimationActive={false} />
            <Line yAxisId="mi" dataKey="miles" name="Longest queue (mi)" stroke="var(--color-s6)" strokeWidth={2} dot={false} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <div className="sr-only">
        <table>
          <caption>Lane-closed hours and longest queue by day, representative iteration</caption>
          <thead>
            <tr>
              <th scope="col">Date</th>
              <th scope="col">Lane-closed hours</th>
              <th scope="col">Longest queue (mi)</th>
              <th scope="col">Delay (veh-h)</th>
              <th scope="col">Queue cleared</th>
            </tr>
          </thead>
          <tbody>
            {t.days.map((d, i) => (
              <tr key={d.date}>
                <td>{formatIsoDate(d.date)}</td>
                <td>{data[i].hours}</td>
                <td>{d.peakQueueMiles}</td>
                <td>{num(d.delayVehHours)}</td>
                <td>{d.clearsAt ? d.clearsAt.replace("T", " ") : "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </figure>
  );
}

/** The panel as the results view shows it. */
export function DelayPanel({ summary }: { summary: RunSummary }) {
  const t = summary.traffic;
  return (
    <div className="space-y-4" data-testid="delay-panel">
      <DelayTotals summary={summary} />
      {t?.maxQueue && (
        <p className="text-sm" data-testid="delay-max-queue">
          In the representative iteration the longest queue is <strong>{t.maxQueue.miles} miles</strong> ({num(t.maxQueue.vehicles)} vehicles) on{" "}
          {formatIsoDate(t.maxQueue.date)}; {t.workingDays > 0 ? `${t.workingDays} working days, ` : ""}
          {num(t.delayVehHours)} vehicle-hours of delay in all. Queue length assumes {t.jamDensityPcPerMiPerLane} passenger cars per lane-mile at a standstill.
        </p>
      )}
      <DelayChart summary={summary} />
    </div>
  );
}
