"use client";
/**
 * What a run costs the public and the owner: delay and cost totals (P50/P80 over iterations) and, for the
 * representative iteration, a day-by-day chart of lane-closed hours (bars) and the day's longest queue in miles
 * (line) on a date axis, so the winter without closures shows as the gap it is, with the same figures as a
 * table for screen readers. Reads only `summary.delay`, `summary.cost`
 * and `summary.traffic` (absent when the scenario has no traffic or costs section: the panel says so).
 */
import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { parseIsoDate } from "@sim/dates";
import type { NumberQuantiles, RunSummary } from "@sim/summary";
import { formatClockOnDay, formatIsoDate } from "@/lib/format";
import { memo } from "react";
import { AXIS_TICK, GRID_STROKE } from "./chart-style";
import { BandsLayer, BarsLayer } from "./chart-layers";
import { ChartPlaceholder } from "./chart-placeholder";
import { Deferred } from "./deferred";
import { ChartLegend } from "./legend-swatch";
import { dateTicks } from "./date-axis";

/** Stretches of more than a month without a closure day (a winter, a long stand-down): shaded and named. */
const LONG_GAP_DAYS = 30;

// One formatter per precision: building one per call (toLocaleString with options) costs ~0.1 ms, and the day table calls it hundreds of times.
const numberFormats = new Map<number, Intl.NumberFormat>();
const numberFormat = (digits: number) => {
  let f = numberFormats.get(digits);
  if (!f) numberFormats.set(digits, (f = new Intl.NumberFormat("en-US", { maximumFractionDigits: digits })));
  return f;
};
const num = (v: number | null | undefined, digits = 0) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : numberFormat(digits).format(v));
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

interface DayRow {
  date: string;
  /** Day number of the day's middle (where its queue point sits). */
  day: number;
  hours: number | null;
  miles: number | null;
}

/** A round upper end for the hours axis (1, 2 or 5 × a power of ten), so its ticks read as whole numbers. */
export function niceCeiling(max: number): number {
  if (!(max > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(max));
  return ([1, 2, 5, 10].find((m) => m * p >= max) ?? 10) * p;
}

/**
 * Evenly spaced ticks from 0 to a `niceCeiling` top: fifths of 1 × 10ᵏ and 5 × 10ᵏ, quarters of 2 × 10ᵏ. The
 * chart library's own choice for a top of 50 was 0, 15, 30, 50 — uneven steps a reader takes for a misprint.
 */
export function niceTicks(top: number): number[] {
  const lead = top / 10 ** Math.floor(Math.log10(top) + 1e-9);
  const steps = Math.abs(lead - 2) < 1e-9 ? 4 : 5;
  return Array.from({ length: steps + 1 }, (_, i) => Number(((top * i) / steps).toPrecision(12)));
}

function DayTip({ active, payload }: { active?: boolean; payload?: readonly { payload?: DayRow }[] }) {
  const row = payload?.[0]?.payload;
  if (!active || !row || !row.date) return null;
  return (
    <div className="rounded-md border border-line bg-white px-2 py-1 text-xs shadow-sm">
      <p className="font-medium">{formatIsoDate(row.date)}</p>
      <p>Lane-closed hours: {row.hours ?? "—"}</p>
      <p>Longest queue: {row.miles ?? "—"} mi</p>
    </div>
  );
}

export function DelayChart({ summary }: { summary: RunSummary }) {
  const t = summary.traffic;
  if (!t) return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">This plan has no traffic profile, so there are no queues to draw. Add one in the plan editor’s Traffic section.</p>;
  if (t.days.length === 0) return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">The representative iteration used no closure.</p>;
  const data: DayRow[] = t.days.map((d) => ({
    date: d.date,
    day: parseIsoDate(d.date) + 0.5,
    hours: Math.round(Object.values(d.laneClosedHours ?? {}).reduce((a, b) => a + b, 0) * 10) / 10,
    miles: d.peakQueueMiles,
  }));
  const max = t.maxQueue;
  const lo = data[0].day - 0.5;
  const hi = data[data.length - 1].day + 0.5;
  const { ticks, label: tickLabel } = dateTicks(lo, hi, 8);
  const gaps = data.slice(1).flatMap((d, i) => (d.day - data[i].day > LONG_GAP_DAYS ? [{ x1: data[i].day + 0.5, x2: d.day - 0.5 }] : []));
  // A point with no value in each long gap, so the queue line stops there instead of drawing across the winter.
  const drawn: DayRow[] = [...data, ...gaps.map((g) => ({ date: "", day: (g.x1 + g.x2) / 2, hours: null, miles: null }))].sort((a, b) => a.day - b.day);
  // Each day's bar over the middle 80 % of the day, as recharts' own bars had it; drawn as one path.
  const bars = data.map((d) => ({ x1: d.day - 0.4, x2: d.day + 0.4, value: d.hours ?? 0 }));
  const hoursTop = niceCeiling(Math.max(...bars.map((b) => b.value)));
  const aria = `Day-by-day chart for the representative iteration (${data.length} days with a closure or a queue): bars are lane-closed hours, the line is the day’s longest queue in miles${max ? `; the longest is ${max.miles} miles on ${formatIsoDate(max.date)}` : ""}. The same figures are in the table that follows.`;
  return (
    <figure aria-label={aria} className="m-0" data-testid="delay-chart" data-drawn-seed={summary.seed}>
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={232} initialDimension={{ width: 700, height: 232 }}>
          <ComposedChart data={drawn} margin={{ top: 8, right: 8, bottom: 28, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" vertical={false} />
            <BandsLayer bands={gaps.map((g) => ({ ...g, fill: "var(--color-brand-100)", fillOpacity: 0.6, label: g.x2 - g.x1 > (hi - lo) / 10 ? "No closures" : undefined }))} />
            <XAxis
              dataKey="day"
              type="number"
              domain={[lo, hi]}
              ticks={ticks}
              tickFormatter={tickLabel}
              interval="preserveStart"
              tick={AXIS_TICK}
              label={{ value: "Date", position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }}
            />
            <YAxis yAxisId="h" type="number" domain={[0, hoursTop]} ticks={niceTicks(hoursTop)} allowDataOverflow tick={AXIS_TICK} width={56} label={{ value: "Lane-closed hours", angle: -90, position: "insideLeft", dy: 40, fill: "var(--color-ink)", fontSize: 12 }} />
            {/* Wide enough for the ticks and the title beside them; the title is centred on the axis, never cut. */}
            <YAxis yAxisId="mi" orientation="right" tick={AXIS_TICK} width={64} label={{ value: "Longest queue (mi)", angle: 90, position: "insideRight", offset: 4, style: { textAnchor: "middle" }, fill: "var(--color-ink)", fontSize: 12 }} />
            <Tooltip content={DayTip} />
            <BarsLayer bars={bars} yAxisId="h" fill="var(--color-s2)" />
            <Line yAxisId="mi" dataKey="miles" name="Longest queue (mi)" stroke="var(--color-s6)" strokeWidth={2} dot={false} connectNulls={false} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {/* Below the chart in ink, as on the other charts (it sat centred above this one). */}
      <figcaption className="mt-2">
        <ChartLegend
          items={[
            { label: "Lane-closed hours", fill: "var(--color-s2)" },
            { label: "Longest queue (mi)", line: { stroke: "var(--color-s6)" } },
            { label: "No closures (shaded)", fill: "var(--color-brand-100)" },
          ]}
        />
      </figcaption>
      <Deferred>
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
                <td>{formatClockOnDay(d.clearsAt, d.date)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      </Deferred>
    </figure>
  );
}

const Chart = memo(DelayChart);

/**
 * The panel as the results view shows it. `chartOf`: the summary its chart draws — the view hands charts a new
 * summary one at a time (use-staged.ts), null for a placeholder until then.
 */
export function DelayPanel({ summary, chartOf = summary }: { summary: RunSummary; chartOf?: RunSummary | null }) {
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
      {chartOf ? <Chart summary={chartOf} /> : <ChartPlaceholder height={260} />}
    </div>
  );
}
