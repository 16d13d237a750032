"use client";
/**
 * Light layers drawn straight onto a recharts chart's SVG with its own scales (recharts' public hooks):
 * lines, bars and shaded bands as a handful of <path> and <rect> elements. Recharts' own <Line>, <Bar> and
 * <ReferenceArea> cost a React element and store updates per point, bar or band, which made drawing a
 * 20,000-iteration result block the page for hundreds of milliseconds; these cost one element per series,
 * and lines are reduced to at most four points per pixel column first (./downsample.ts). They sit inside the
 * plot area (clipped to it) and take no part in axis domains, so the charts that use them set their domains.
 *
 * Class names follow recharts' (`recharts-line`, `recharts-line-curve`, `recharts-bar-rectangle`), so
 * styles, tests and the browser benchmark find the drawn shapes where they found recharts' own.
 */
import { useId, useMemo } from "react";
import { usePlotArea, useXAxisScale, useYAxisScale } from "recharts";
import { barsPath, downsampleLine, linePath, type LinePoint } from "./downsample";

type Scale = (v: number) => number | undefined;

type Area = { x: number; y: number; width: number; height: number };

/** The chart's scales and plot area, or null before recharts has measured the chart. */
function usePlot(yAxisId?: string): { sx: Scale; sy: Scale; area: Area } | null {
  const sx = useXAxisScale() as Scale | undefined;
  const sy = useYAxisScale(yAxisId) as Scale | undefined;
  const area = usePlotArea();
  return useMemo(() => (sx && sy && area && area.width > 0 ? { sx, sy, area } : null), [sx, sy, area]);
}

/** An id usable in `url(#…)` (React's ids contain characters a URL fragment would need escaped). */
function useClipId(): string {
  return `pl-clip-${useId().replace(/[^a-zA-Z0-9_-]/g, "")}`;
}

function Clip({ id, area }: { id: string; area: Area }) {
  return (
    <defs>
      <clipPath id={id}>
        <rect x={area.x} y={area.y} width={area.width} height={area.height} />
      </clipPath>
    </defs>
  );
}

export interface LayerSeries {
  key: string;
  /** x in the x axis' units, y in the y axis' units; y null breaks the line. */
  points: readonly LinePoint[];
  stroke: string;
  strokeDasharray?: string;
  strokeWidth: number;
  strokeOpacity?: number;
}

/** One path per series, in the given order (later ones on top). */
export function SeriesLayer({ series }: { series: readonly LayerSeries[] }) {
  const plot = usePlot();
  const clip = useClipId();
  const paths = useMemo(() => {
    if (!plot) return [];
    const { sx, sy } = plot;
    return series.map((s) => {
      const px: LinePoint[] = s.points.map((p) => ({ x: sx(p.x) ?? NaN, y: p.y === null ? null : (sy(p.y) ?? NaN) }));
      return { s, d: linePath(downsampleLine(px, Math.floor)) };
    });
  }, [plot, series]);
  if (!plot) return null;
  return (
    <g className="recharts-layer" clipPath={`url(#${clip})`}>
      <Clip id={clip} area={plot.area} />
      {paths.map(({ s, d }) => (
        <g key={s.key} className="recharts-layer recharts-line">
          <path
            className="recharts-curve recharts-line-curve"
            d={d}
            fill="none"
            stroke={s.stroke}
            strokeDasharray={s.strokeDasharray || undefined}
            strokeWidth={s.strokeWidth}
            strokeOpacity={s.strokeOpacity}
            strokeLinejoin="round"
          />
        </g>
      ))}
    </g>
  );
}

export interface LayerBand {
  x1: number;
  x2: number;
  fill: string;
  fillOpacity: number;
  label?: string;
  /** How far below the plot's top the label's baseline sits (16 px): lower where another label shares the top. */
  labelY?: number;
}

/** Shaded spans of the x axis over the plot's full height, with an optional label at the top. */
export function BandsLayer({ bands }: { bands: readonly LayerBand[] }) {
  // The x axis only: a chart whose y axes all have ids of their own has no default one.
  const sx = useXAxisScale() as Scale | undefined;
  const area = usePlotArea();
  const clip = useClipId();
  if (!sx || !area || !(area.width > 0)) return null;
  return (
    <g className="recharts-layer recharts-reference-area" clipPath={`url(#${clip})`}>
      <Clip id={clip} area={area} />
      {bands.map((b, i) => {
        const x1 = sx(b.x1) ?? NaN;
        const x2 = sx(b.x2) ?? NaN;
        if (!(x2 > x1)) return null;
        return (
          <g key={i}>
            <rect x={x1} y={area.y} width={x2 - x1} height={area.height} fill={b.fill} fillOpacity={b.fillOpacity} />
            {b.label && (
              <text x={(x1 + x2) / 2} y={area.y + (b.labelY ?? 16)} textAnchor="middle" fontSize={12} fill="var(--color-brand-800)">
                {b.label}
              </text>
            )}
          </g>
        );
      })}
    </g>
  );
}

export interface LayerBar {
  /** The bar's extent on the x axis and its value on the y axis (`yAxisId`). */
  x1: number;
  x2: number;
  value: number;
}

/** Bars from the y axis' zero up to each value, all in one path of one colour. */
export function BarsLayer({ bars, yAxisId, fill }: { bars: readonly LayerBar[]; yAxisId?: string; fill: string }) {
  const plot = usePlot(yAxisId);
  const clip = useClipId();
  const d = useMemo(() => {
    if (!plot) return "";
    const { sx, sy } = plot;
    const base = sy(0) ?? plot.area.y + plot.area.height;
    return barsPath(
      bars.map((b) => ({ x1: sx(b.x1) ?? NaN, x2: sx(b.x2) ?? NaN, y: sy(b.value) ?? base })),
      base,
    );
  }, [plot, bars]);
  if (!plot) return null;
  return (
    <g className="recharts-layer recharts-bar" clipPath={`url(#${clip})`}>
      <Clip id={clip} area={plot.area} />
      <g className="recharts-bar-rectangle">
        <path d={d} fill={fill} />
      </g>
    </g>
  );
}
