"use client";
/**
 * The cumulative confidence curve: for each date, the share of iterations finished by then (a step curve,
 * since it is the empirical distribution of the run). One or more curves on one date axis (day numbers, so
 * scenarios with different start dates line up); optional percentile markers and a target line.
 */
import { CartesianGrid, Line, LineChart, ReferenceDot, ReferenceLine, ResponsiveContainer, XAxis, YAxis } from "recharts";
import { AXIS_TICK, GRID_STROKE } from "./chart-style";
import { dateTicks, isoToDay } from "./date-axis";

export interface Curve {
  id: string;
  name: string;
  points: { x: number; y: number }[];
  stroke: string;
  strokeDasharray: string;
}

export interface Marker {
  label: string;
  x: number;
  /** Percent, 0–100. */
  y: number;
}

/** RunSummary.cdf → chart points (x day number, y percent). */
export function cdfPoints(cdf: { date: string; p: number }[]): { x: number; y: number }[] {
  const out: { x: number; y: number }[] = [];
  for (const c of cdf) {
    const x = isoToDay(c.date);
    if (x !== null) out.push({ x, y: c.p * 100 });
  }
  return out;
}

export function ConfidenceChart({
  curves,
  markers = [],
  target,
  height = 300,
}: {
  curves: Curve[];
  markers?: Marker[];
  target?: { x: number; label: string } | null;
  height?: number;
}) {
  const xs = curves.flatMap((c) => c.points.map((p) => p.x));
  if (target) xs.push(target.x);
  for (const m of markers) xs.push(m.x);
  const lo = Math.floor(Math.min(...xs)) - 1;
  const hi = Math.ceil(Math.max(...xs)) + 1;
  const { ticks, label } = dateTicks(lo, hi, 7);
  return (
    <ResponsiveContainer width="100%" height={height} initialDimension={{ width: 700, height }}>
      <LineChart margin={{ top: 24, right: 24, bottom: 28, left: 8 }} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" />
        <XAxis
          type="number"
          dataKey="x"
          domain={[lo, hi]}
          ticks={ticks}
          // Keep the first tick, the one that carries the year, when a phone-wide chart drops the overlapping ones.
          interval="preserveStart"
          tickFormatter={label}
          tick={AXIS_TICK}
          allowDataOverflow
          label={{ value: "Finish date", position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }}
        />
        <YAxis
          type="number"
          domain={[0, 100]}
          ticks={[0, 20, 40, 60, 80, 100]}
          tickFormatter={(v: number) => `${v} %`}
          tick={AXIS_TICK}
          width={56}
          label={{ value: "Iterations finished (%)", angle: -90, position: "insideLeft", offset: 4, dy: 60, fill: "var(--color-ink)", fontSize: 12 }}
        />
        {curves.map((c) => (
          <Line
            key={c.id}
            data={c.points}
            dataKey="y"
            name={c.name}
            type="stepAfter"
            stroke={c.stroke}
            strokeDasharray={c.strokeDasharray || undefined}
            strokeWidth={2.5}
            dot={false}
            activeDot={false}
            isAnimationActive={false}
          />
        ))}
        {markers.map((m) => (
          <ReferenceLine key={`l-${m.label}`} x={m.x} stroke="var(--color-muted)" strokeDasharray="2 3" ifOverflow="extendDomain" />
        ))}
        {markers.map((m) => (
          <ReferenceDot
            key={`d-${m.label}`}
            x={m.x}
            y={m.y}
            r={4}
            fill="var(--color-ink)"
            stroke="white"
            label={{ value: m.label, position: "left", fill: "var(--color-ink)", fontSize: 12, fontWeight: 600 }}
          />
        ))}
        {target && (
          <ReferenceLine
            x={target.x}
            stroke="var(--color-bad)"
            strokeWidth={2}
            label={{ value: target.label, position: "top", fill: "var(--color-bad)", fontSize: 12, fontWeight: 600 }}
          />
        )}
      </LineChart>
    </ResponsiveContainer>
  );
}
