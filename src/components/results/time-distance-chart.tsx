"use client";
/**
 * Time–distance chart of the representative iteration: date across, station up, one line per operation
 * (and stage), gaps where the crew paused, winter and holiday stand-downs shaded. With several stages a
 * selector shows all of them (each stage's start marked and labelled) or one; an operation keeps its colour
 * and dash in every stage. Under the chart, the closure strip reads the run's closure timeline on the same
 * dates. Stations and shading come from the plan (the definition); the trace from the run. Rendering stays
 * light: the lines and the stand-down shading are drawn as a few paths on the chart's scales (./chart-layers,
 * lines reduced to four points per pixel column), no dots, no animation.
 */
import { useMemo, useState } from "react";
import { CartesianGrid, LineChart, ReferenceLine, ResponsiveContainer, XAxis, YAxis } from "recharts";
import { compileStandDowns, HORIZON_DAYS } from "@sim/calendar";
import type { Scenario } from "@sim/schema";
import type { RunSummary } from "@sim/summary";
import { formatStation } from "@/lib/format";
import { stageLabel } from "@/lib/stage-text";
import { AXIS_TICK, GRID_STROKE, seriesStyle } from "./chart-style";
import { dateTicks, formatDay, hoursToDay } from "./date-axis";
import { BandsLayer, SeriesLayer, type LayerBand, type LayerSeries } from "./chart-layers";
import { ClosureStrip } from "./closure-strip-view";
import { Deferred } from "./deferred";
import { AreaSwatch, LineSwatch } from "./legend-swatch";
import { StageSelector } from "./stage-selector";
import { seriesByStage } from "./stage-series";
import { standDowns } from "./stand-downs";

const STATION_STEPS = [100, 200, 500, 1000, 2000, 5000, 10000];

function stationTicks(lo: number, hi: number, max = 8): number[] {
  const step = STATION_STEPS.find((s) => (hi - lo) / s <= max) ?? 20000;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi; v += step) out.push(v);
  // The deck's ends are always labelled; a grid tick too close to an end would overlap it.
  const inner = out.filter((v) => v - lo >= step / 2 && hi - v >= step / 2);
  return [lo, ...inner, hi];
}

const hoursText = (h: number) => `${Math.round(h).toLocaleString("en-US")} h`;

/** Recorded progress of one operation: x day numbers, y stations; a null y breaks the line between shifts. */
export interface ActualSeries {
  id: string;
  points: { x: number; y: number | null }[];
}

export function TimeDistanceChart({
  summary,
  plan,
  stale,
  actuals,
  dataDay,
}: {
  summary: RunSummary;
  plan: Scenario | null;
  stale: boolean;
  /** Optional overlay of recorded progress (drawn thick and pale in the operation's colour). */
  actuals?: ActualSeries[];
  /** Optional data date (day number of its 24:00) drawn as a vertical line. */
  dataDay?: number;
}) {
  const trace = summary.representative?.trace;
  const [shown, setShown] = useState("all");
  const model = useMemo(() => {
    if (!plan || !trace) return null;
    const names = new Map(summary.operations.map((o) => [o.id, o.name]));
    const ops = plan.operations.map((o) => ({ id: o.id, name: names.get(o.id) ?? o.name }));
    const toX = (h: number) => hoursToDay(summary.startDate, h);
    const stageNames = new Map((summary.stages ?? []).map((st) => [st.id, st]));
    const groups = seriesByStage(trace, plan.deck, plan.stages.map((st) => ({ id: st.id, name: stageNames.get(st.id)?.name ?? st.name, lanes: st.lanes })), ops, toX).filter((g) => g.series.length > 0);
    const drawn = groups.flatMap((g) => g.series).filter((s) => s.points.length > 0);
    const actualX = (actuals ?? []).flatMap((a) => a.points.map((p) => p.x));
    if (drawn.length === 0 && actualX.length === 0) return { groups, bands: [], lo: 0, hi: 0 };
    const lo = Math.min(...drawn.map((s) => s.firstStart!), ...actualX);
    const hi = Math.max(...drawn.map((s) => s.lastFinish!), ...actualX);
    // Stand-downs from the plan's calendar, in the plan's own hours, then onto the shared day axis.
    const planDay0 = hoursToDay(plan.startDate, 0);
    const fromH = (lo - planDay0) * 24;
    const toH = (hi - planDay0) * 24;
    const days = Math.min(HORIZON_DAYS, Math.max(1, Math.ceil(toH / 24) + 2));
    const bands = toH > 0 ? standDowns(compileStandDowns(plan, days), plan.calendar.season.demobilizeHours, Math.max(0, fromH), toH) : [];
    return { groups, bands: bands.map((b) => ({ kind: b.kind, x1: planDay0 + b.start / 24, x2: planDay0 + b.end / 24 })), lo, hi };
  }, [plan, trace, summary.operations, summary.stages, summary.startDate, actuals]);

  if (!plan) return <p className="text-sm text-muted">The plan behind this run could not be read, so stations cannot be drawn.</p>;
  if (!model || model.lo === model.hi) {
    return <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">The representative iteration did no work that can be drawn (it did not finish within the horizon).</p>;
  }
  const { groups, bands } = model;
  const staged = groups.length > 1;
  const visible = staged && shown !== "all" ? groups.filter((g) => g.stage?.id === shown) : groups;
  // One stage on its own is drawn over its own dates (the closure strip follows); all stages share the whole span.
  const own = visible.length < groups.length ? visible.flatMap((g) => g.series).filter((s) => s.points.length > 0) : [];
  const lo = own.length ? Math.min(...own.map((s) => s.firstStart!)) : model.lo;
  const hi = own.length ? Math.max(...own.map((s) => s.lastFinish!)) : model.hi;
  const series = visible.flatMap((g) => g.series.map((s) => ({ ...s, key: `${g.stage?.id ?? ""}/${s.id}`, stage: g.stage })));
  // The legend lists each operation once, in the plan's order, with the style it has in every stage.
  const legend = [...new Map(series.map((s) => [s.id, s])).values()].sort((a, b) => a.styleIndex - b.styleIndex);
  const stageStarts = staged ? visible.map((g) => ({ id: g.stage!.id, label: `Stage ${groups.indexOf(g) + 1} starts`, x: Math.min(...g.series.filter((s) => s.firstStart !== null).map((s) => s.firstStart!)) })).filter((m) => Number.isFinite(m.x)) : [];
  // Holidays in neutral grey: a coloured band would hide the operation line of the same hue.
  const bandLayer: LayerBand[] = bands.map((b) => ({
    x1: b.x1,
    x2: b.x2,
    fill: b.kind === "winter" ? "var(--color-brand-100)" : "var(--color-muted)",
    fillOpacity: b.kind === "winter" ? 0.7 : 0.16,
    label: b.kind === "winter" && b.x2 - b.x1 > (hi - lo) / 12 ? "Winter" : undefined,
    // Below the data date's label, which sits at the top beside its line — on a phone the two ran into each other.
    ...(dataDay !== undefined ? { labelY: 34 } : {}),
  }));
  // Recorded progress under the plan's lines: thick and pale, in the operation's colour.
  const lineLayer: LayerSeries[] = [
    ...(actuals ?? []).map((a) => {
      const i = series.find((s) => s.id === a.id)?.styleIndex ?? -1;
      return { key: `actual-${a.id}`, points: a.points, stroke: i >= 0 ? seriesStyle(i).stroke : "var(--color-muted)", strokeOpacity: 0.4, strokeWidth: 7 };
    }),
    ...series.map((s) => ({ key: s.key, points: s.points, ...seriesStyle(s.styleIndex), strokeWidth: 2.5 })),
  ];
  const yLo = plan.deck.startStationFt;
  const yHi = plan.deck.startStationFt + plan.deck.lengthFt;
  const { ticks, label } = dateTicks(lo, hi, 8);
  const winters = bands.filter((b) => b.kind === "winter").length;
  const holidays = bands.filter((b) => b.kind === "holiday").length;
  const unfinished = series.reduce((n, s) => n + s.unfinishedPackets, 0);
  const aria =
    `Time–distance chart of iteration ${summary.representative.iteration + 1} (finish nearest the P50): ${legend.length} operations ` +
    (staged ? `in ${visible.length === groups.length ? `${groups.length} stages, each stage's start marked` : visible[0]?.stage?.name} ` : "") +
    `from ${formatStation(yLo)} to ${formatStation(yHi)} between ${formatDay(lo)} and ${formatDay(hi)}. ` +
    `Gaps in a line are pauses (nights, weather, stand-downs). Shaded: ${winters} winter and ${holidays} holiday stand-downs. The table below lists each operation${staged ? " of each stage" : ""}.`;

  return (
    <figure aria-label={aria} className="m-0" data-drawn-seed={summary.seed}>
      {stale && <p className="mb-2 text-xs text-warn">The plan changed after this run: stations and stand-down shading follow the current plan.</p>}
      {staged && <StageSelector stages={groups.map((g) => g.stage!)} finishes={summary.stages ?? []} value={shown} onChange={setShown} />}
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={380} initialDimension={{ width: 700, height: 380 }}>
          <LineChart margin={{ top: stageStarts.length ? 26 : 16, right: 24, bottom: 28, left: 16 }} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" />
            <XAxis
              type="number"
              dataKey="x"
              domain={[lo, hi]}
              ticks={ticks}
              tickFormatter={label}
              tick={AXIS_TICK}
              allowDataOverflow
              label={{ value: "Date", position: "insideBottom", offset: -16, fill: "var(--color-ink)", fontSize: 12 }}
            />
            <YAxis
              type="number"
              domain={[yLo, yHi]}
              // The deck's ends exactly (the lines are drawn by a layer that gives recharts no data to widen it with).
              allowDataOverflow
              ticks={stationTicks(yLo, yHi)}
              // A no-break space keeps "STA 40+00" on one line (the axis would wrap it at the space).
              tickFormatter={(v: number) => formatStation(v).replace(" ", "\u00a0")}
              tick={AXIS_TICK}
              width={84}
              label={{ value: "Station (1 STA = 100 ft)", angle: -90, position: "insideLeft", offset: 0, dy: 70, fill: "var(--color-ink)", fontSize: 12 }}
            />
            <BandsLayer bands={bandLayer} />
            {stageStarts.map((m) => (
              <ReferenceLine key={`stage-${m.id}`} x={m.x} stroke="var(--color-ink)" strokeDasharray="2 2" ifOverflow="hidden" label={{ value: `▸ ${m.label}`, position: "top", textAnchor: "start", dx: -4, fontSize: 12, fontWeight: 600, fill: "var(--color-ink)" }} />
            ))}
            {dataDay !== undefined && <ReferenceLine x={dataDay} stroke="var(--color-ink)" strokeDasharray="4 3" ifOverflow="hidden" label={{ value: "Data date", position: "insideTopRight", fontSize: 12, fill: "var(--color-ink)" }} />}
            <SeriesLayer series={lineLayer} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2">
        <ul className="flex flex-wrap gap-x-5 gap-y-1.5 text-xs text-ink" aria-label="Legend">
          {legend.map((s) => (
            <li key={s.id} className="flex items-center gap-1.5">
              <LineSwatch {...seriesStyle(s.styleIndex)} />
              {s.name}
            </li>
          ))}
          {actuals && actuals.length > 0 && (
            <li className="flex items-center gap-1.5">
              <span aria-hidden="true" className="inline-block h-1.5 w-6 rounded bg-ink/40" />
              Recorded progress (thick, pale)
            </li>
          )}
          <li className="flex items-center gap-1.5">
            <AreaSwatch className="bg-brand-100" />
            Winter stand-down
          </li>
          <li className="flex items-center gap-1.5">
            <AreaSwatch className="bg-muted/20" />
            Holiday stand-down
          </li>
        </ul>
        {unfinished > 0 && <p className="mt-1 text-xs text-warn">{unfinished} packets of this iteration did not finish within the horizon and are not drawn.</p>}
      </figcaption>
      {/* A task after the chart: its bars and their sweep would otherwise lengthen the chart's own task. */}
      {summary.representative?.closureTimeline && (
        <Deferred>
          <ClosureStrip timeline={summary.representative.closureTimeline} lo={lo} hi={hi} laneClosed={summary.laneClosedHours} />
        </Deferred>
      )}
      <div className="sr-only">
        <table data-testid="time-distance-table">
        <caption>Operations in the representative iteration</caption>
        <thead>
          <tr>
            {staged && <th scope="col">Stage</th>}
            <th scope="col">Operation</th>
            <th scope="col">First start</th>
            <th scope="col">Last finish</th>
            <th scope="col">Stretches of work</th>
            <th scope="col">Paused for weather inside packets</th>
            <th scope="col">Paused by the calendar inside packets</th>
          </tr>
        </thead>
        <tbody>
          {series.map((s) => (
            <tr key={s.key}>
              {staged && <td>{s.stage ? stageLabel(s.stage.name, groups.findIndex((g) => g.stage?.id === s.stage!.id)) : ""}</td>}
              <th scope="row">{s.name}</th>
              <td>{s.firstStart === null ? "—" : formatDay(s.firstStart)}</td>
              <td>{s.lastFinish === null ? "—" : formatDay(s.lastFinish)}</td>
              <td>{s.pieces}</td>
              <td>{hoursText(s.pausedHours.weather)}</td>
              <td>{hoursText(s.pausedHours.closed)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
    </figure>
  );
}
