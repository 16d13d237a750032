"use client";
/**
 * Forecast drift: the P50 and P80 finish of the plan run (first point) and of each re-forecast, by data date,
 * so one sees how the finish moved as the work went on. Dates are day numbers on the y axis.
 */
import { CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { AXIS_TICK, GRID_STROKE, seriesStyle } from "@/components/results/chart-style";
import { dateTicks, formatDay, isoToDay } from "@/components/results/date-axis";
import { ChartLegend } from "@/components/results/legend-swatch";
import { formatIsoDate } from "@/lib/format";

export interface DriftPoint {
  label: string;
  /** When (and by whom) it was run, in words: "run 4 Dec 2026, 12:57 by Dana Whitcomb". */
  made: string;
  p50: string;
  p80: string;
}

export function DriftChart({ points }: { points: DriftPoint[] }) {
  const data = points.map((p) => ({ label: p.label, p50: isoToDay(p.p50), p80: isoToDay(p.p80) }));
  const ys = data.flatMap((d) => [d.p50, d.p80]).filter((y): y is number => y !== null);
  const lo = ys.length ? Math.min(...ys) - 3 : 0;
  const hi = ys.length ? Math.max(...ys) + 3 : 1;
  // Calendar-aligned ticks (weeks on a Monday, or firsts of months) as the other date axes: left to itself the
  // chart library spaced them 20, 20 and then 23 days apart, ending on whatever date the domain ended on.
  const { ticks, label } = dateTicks(lo, hi, 6);
  const p50 = seriesStyle(0);
  const p80 = seriesStyle(1);
  return (
    <figure className="m-0" data-testid="drift-chart" aria-label={`Forecast drift over ${points.length} forecasts: the P50 and P80 finish dates, the plan first, then each data date. The table below lists them.`}>
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={280} initialDimension={{ width: 700, height: 280 }}>
          <LineChart data={data} margin={{ top: 12, right: 24, bottom: 28, left: 16 }} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" />
            <XAxis dataKey="label" tick={AXIS_TICK} label={{ value: "Data date", position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }} />
            <YAxis type="number" domain={[lo, hi]} ticks={ticks} interval={0} tickFormatter={label} tick={AXIS_TICK} width={104} allowDecimals={false} />
            <Tooltip formatter={(v) => (typeof v === "number" ? formatDay(v) : String(v))} />
            <Line dataKey="p50" name="P50 finish" stroke={p50.stroke} strokeWidth={2} isAnimationActive={false} connectNulls={false} />
            <Line dataKey="p80" name="P80 finish" stroke={p80.stroke} strokeDasharray={p80.strokeDasharray} strokeWidth={2} isAnimationActive={false} connectNulls={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2">
        <ChartLegend items={[{ label: "P50 finish", line: p50 }, { label: "P80 finish", line: p80 }]} />
      </figcaption>
      <table className="mt-3 w-full text-sm">
        <caption className="sr-only">Forecast drift by data date</caption>
        <thead>
          <tr className="border-b border-line text-left">
            <th scope="col" className="py-1 pr-3">Forecast</th>
            <th scope="col" className="py-1 pr-3">P50 finish</th>
            <th scope="col" className="py-1">P80 finish</th>
          </tr>
        </thead>
        <tbody>
          {points.map((p, i) => (
            <tr key={i} className="border-b border-line/60 align-top">
              <th scope="row" className="py-1 pr-3 text-left font-normal">
                {p.label}
                <span className="block text-xs text-muted">{p.made}</span>
              </th>
              <td className="py-1 pr-3 whitespace-nowrap">{formatIsoDate(p.p50)}</td>
              <td className="py-1 whitespace-nowrap">{formatIsoDate(p.p80)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
