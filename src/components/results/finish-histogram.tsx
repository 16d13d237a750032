"use client";
/**
 * Finish-date histogram: the run's bins (summary.histogram, ≤ 60) as bars on a date axis with calendar-aligned,
 * evenly spaced ticks (date-axis.ts), with a data table for screen readers.
 */
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { RunSummary } from "@sim/summary";
import { parseIsoDate } from "@sim/dates";
import { formatIsoDate } from "@/lib/format";
import { AXIS_TICK, GRID_STROKE } from "./chart-style";
import { dateTicks } from "./date-axis";

function binLabel(b: { from: string; to: string }): string {
  return b.from === b.to ? formatIsoDate(b.from) : `${formatIsoDate(b.from)} – ${formatIsoDate(b.to)}`;
}

export function FinishHistogram({ summary }: { summary: RunSummary }) {
  const bins = summary.histogram;
  const finished = summary.iterations - summary.unfinishedIterations;
  if (bins.length === 0) {
    return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">No iteration finished, so there is nothing to count.</p>;
  }
  const binDays = parseIsoDate(bins[0].to) - parseIsoDate(bins[0].from) + 1;
  // Each bar sits over its own days: x is the middle of the bin on the day-number axis.
  const data = bins.map((b) => ({ label: binLabel(b), x: parseIsoDate(b.from) + binDays / 2, count: b.count }));
  const lo = parseIsoDate(bins[0].from);
  const hi = parseIsoDate(bins[bins.length - 1].to) + 1;
  const { ticks, label: tickLabel } = dateTicks(lo, hi, 7);
  const peak = bins.reduce((m, b) => (b.count > m.count ? b : m), bins[0]);
  const width = binDays === 1 ? "one day per bar" : `${binDays} days per bar`;
  const aria = `Histogram of finish dates for ${finished.toLocaleString("en-US")} finished iterations, ${bins.length} bars (${width}) from ${formatIsoDate(bins[0].from)} to ${formatIsoDate(bins[bins.length - 1].to)}; the most common is ${binLabel(peak)} with ${peak.count} iterations.`;
  return (
    <figure aria-label={aria} className="m-0" data-testid="finish-histogram" data-drawn-seed={summary.seed}>
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={240} initialDimension={{ width: 700, height: 240 }}>
          <BarChart data={data} margin={{ top: 8, right: 16, bottom: 28, left: 8 }} barCategoryGap={1} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" vertical={false} />
            <XAxis
              dataKey="x"
              type="number"
              domain={[lo, hi]}
              ticks={ticks}
              tickFormatter={tickLabel}
              interval="preserveStart"
              tick={AXIS_TICK}
              label={{ value: `Finish date (${width})`, position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }}
            />
            <YAxis
              allowDecimals={false}
              tick={AXIS_TICK}
              width={56}
              label={{ value: "Iterations", angle: -90, position: "insideLeft", offset: 4, dy: 30, fill: "var(--color-ink)", fontSize: 12 }}
            />
            <Bar dataKey="count" name="Iterations" fill="var(--color-s5)" isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <div className="sr-only">
        <table>
        <caption>Finish dates by bar</caption>
        <thead>
          <tr>
            <th scope="col">Finish dates</th>
            <th scope="col">Iterations</th>
          </tr>
        </thead>
        <tbody>
          {data.map((d) => (
            <tr key={d.label}>
              <td>{d.label}</td>
              <td>{d.count}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
    </figure>
  );
}
