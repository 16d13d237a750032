"use client";
/**
 * The frontier: each finished plan at its P80 finish (x) and median work-zone delay (y); contract cost is the
 * bubble's size and shade. Plans no other plan beats on finish, delay and cost together are drawn filled with
 * a dark ring; the plan as saved is a square. A table below the chart lists the same points for screen readers.
 */
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis } from "recharts";
import { AXIS_TICK, GRID_STROKE } from "@/components/results/chart-style";
import { formatIsoDate } from "@/lib/format";
import { dateTicks } from "@/components/results/date-axis";
import type { VariantRow } from "@/lib/search-contract";
import { chartPoints, costShade, dayLabel, type ChartPoint } from "./search-logic";

const money = (v: number | null) => (v === null ? "—" : `$${Math.round(v).toLocaleString("en-US")}`);

function Dot(props: { cx?: number; cy?: number; payload?: ChartPoint & { shade: number | null } }) {
  const { cx = 0, cy = 0, payload } = props;
  if (!payload) return null;
  const r = 5 + (payload.shade ?? 0.5) * 7;
  const fill = payload.onFrontier ? "var(--color-s5)" : "white";
  const stroke = payload.onFrontier ? "var(--color-ink)" : "var(--color-s6)";
  if (payload.current) return <rect x={cx - r} y={cy - r} width={2 * r} height={2 * r} fill={fill} stroke="var(--color-ink)" strokeWidth={2} />;
  return <circle cx={cx} cy={cy} r={r} fill={fill} fillOpacity={payload.onFrontier ? 0.85 : 1} stroke={stroke} strokeWidth={payload.onFrontier ? 2 : 1.5} />;
}

export function FrontierChart({ rows }: { rows: VariantRow[] }) {
  const points = chartPoints(rows);
  const shade = costShade(points);
  const data = points.map((p) => ({ ...p, shade: shade(p.cost) }));
  if (data.length === 0) return <p className="text-sm text-muted">No plan has finished yet; points appear here as they do.</p>;
  // Calendar ticks with dates in words, as on the results charts (the axis read "2027-06-13" in steps of 8 days).
  const days = data.map((p) => p.finishDay);
  const lo = Math.min(...days) - 7;
  const hi = Math.max(...days) + 7;
  const { ticks, label } = dateTicks(lo, hi, 7);
  return (
    <figure>
      <div className="h-80" data-testid="frontier-chart">
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 10, right: 20, bottom: 30, left: 20 }}>
            <CartesianGrid stroke={GRID_STROKE} />
            <XAxis type="number" dataKey="finishDay" name="P80 finish" domain={[lo, hi]} ticks={ticks} interval="preserveStart" tickFormatter={label} tick={AXIS_TICK} label={{ value: "P80 finish", position: "bottom", offset: 10, fill: "var(--color-ink)", fontSize: 12 }} />
            <YAxis type="number" dataKey="delay" name="Delay" tick={AXIS_TICK} tickFormatter={(v: number) => v.toLocaleString("en-US")} label={{ value: "Delay, vehicle-hours (median)", angle: -90, position: "insideLeft", offset: -5, style: { textAnchor: "middle" }, fill: "var(--color-ink)", fontSize: 12 }} width={80} />
            <ZAxis type="number" dataKey="shade" range={[60, 60]} />
            <Tooltip
              cursor={{ strokeDasharray: "3 3" }}
              content={({ payload }) => {
                const p = payload?.[0]?.payload as ChartPoint | undefined;
                if (!p) return null;
                return (
                  <div className="rounded border border-line bg-white p-2 text-xs shadow">
                    <p className="font-semibold">{p.current ? "The plan as saved" : p.label}</p>
                    <p>P80 finish {formatIsoDate(dayLabel(p.finishDay))}</p>
                    <p>Delay {Math.round(p.delay).toLocaleString("en-US")} veh-h · contract cost {money(p.cost)}</p>
                    {p.onFrontier && <p className="font-semibold">Not beaten on finish, delay and cost together</p>}
                  </div>
                );
              }}
            />
            <Scatter data={data} shape={<Dot />} isAnimationActive={false} />
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 text-xs text-muted">
        Filled points: plans no other plan beats on P80 finish, delay and contract cost together. Square: the plan as saved. Larger points cost more.
      </figcaption>
    </figure>
  );
}
