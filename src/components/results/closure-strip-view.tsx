"use client";
/**
 * The closure strip under the time–distance chart: what is closed, hour by hour, in the representative
 * iteration — one row per closure (a stage's barrier standing round the clock drawn solid, short-term
 * closures hatched, and each row named in words, so colour is never the only cue), and a last row with the
 * lanes closed at once. Its plot area is inset like the chart's (left margin + axis width, right margin), so
 * both share one date axis. A table for screen readers gives the same rows in words. Each row is one SVG path
 * in pixels of the measured strip (hundreds of periods as hundreds of positioned elements made drawing a long
 * plan slow); a period shorter than a pixel is drawn a pixel wide.
 */
import { useEffect, useMemo, useRef, useState } from "react";
import type { ClosurePeriodSummary, LaneClosedHours } from "@sim/summary-closures";
import { formatIsoDate } from "@/lib/format";
import { closureRows, lanesClosed } from "./closure-strip";
import { barsPath } from "./downsample";

/** The time–distance chart's plot inset: LineChart margin.left 16 + YAxis width 84; margin.right 24. */
const INSET = { left: 100, right: 24 };

const STANDING = "var(--color-brand-700)";
const SHORT = "repeating-linear-gradient(135deg, var(--color-s6) 0 3px, transparent 3px 6px)";
const ROW_PX = 14;
const UNION_PX = 24;

/** The width of the strip's drawing area in pixels, once the browser has laid it out (0 before). */
function useDrawingWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const read = () => setWidth(Math.max(0, el.getBoundingClientRect().width - INSET.left - INSET.right));
    read();
    const ro = new ResizeObserver(read);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return { ref, width };
}

/** One row of the strip: its periods as rectangles of one fill, `heightOf` 0–1 of the row for each. */
function StripRow({ bars, width, height, fill, pattern, heightOf }: { bars: { x1: number; x2: number }[]; width: number; height: number; fill: string; pattern?: string; heightOf?: (i: number) => number }) {
  const d = barsPath(
    bars.map((b, i) => ({ x1: b.x1 * width, x2: b.x2 * width, y: height * (1 - (heightOf ? heightOf(i) : 1)) })),
    height,
  );
  return (
    <svg width={width} height={height} className="block">
      {pattern && (
        <defs>
          <pattern id={pattern} patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">
            <rect width="3" height="6" fill="var(--color-s6)" />
          </pattern>
        </defs>
      )}
      <path d={d} fill={pattern ? `url(#${pattern})` : fill} />
    </svg>
  );
}
const h = (x: number) => `${Math.round(x).toLocaleString("en-US")} lane-h`;
const when = (iso: string) => `${formatIsoDate(iso)} ${iso.slice(11, 16)}`;

export function ClosureStrip({ timeline, lo, hi, laneClosed }: { timeline: ClosurePeriodSummary[]; lo: number; hi: number; laneClosed?: LaneClosedHours }) {
  // Computed once per timeline and range: the strip draws again when its width is measured or changes.
  const rows = useMemo(() => closureRows(timeline, lo, hi), [timeline, lo, hi]);
  const union = useMemo(() => lanesClosed(timeline, lo, hi), [timeline, lo, hi]);
  const maxLanes = Math.max(1, ...union.map((u) => u.lanes.length));
  // Periods as fractions of the strip's width.
  const frac = (b: { x1: number; x2: number }) => ({ x1: (b.x1 - lo) / (hi - lo), x2: (b.x2 - lo) / (hi - lo) });
  const p50 = new Map((laneClosed?.byClosure ?? []).map((c) => [c.closure, c.p50]));
  const { ref, width } = useDrawingWidth();

  return (
    <div className="mt-4 border-t border-line pt-3" data-testid="closure-strip" ref={ref}>
      <p className="text-sm font-medium">What is closed, hour by hour</p>
      <p className="text-xs text-muted">
        Same iteration and dates as the chart. <span className="inline-block h-2.5 w-5 align-middle" style={{ background: STANDING }} aria-hidden="true" /> solid: a
        stage&apos;s lanes behind barrier, round the clock. <span className="inline-block h-2.5 w-5 border border-s6 align-middle" style={{ background: SHORT }} aria-hidden="true" />{" "}
        hatched: a short-term closure while a crew works, set-up and take-down included.
        {laneClosed ? ` Lane-closed hours, P50 over iterations: ${h(laneClosed.total.p50)} in all.` : ""}
      </p>
      {rows.length === 0 ? (
        <p className="mt-2 text-sm text-muted">No lane was closed in this iteration.</p>
      ) : (
        <div aria-hidden="true" className="mt-2 space-y-1.5">
          {rows.map((r) => (
            <div key={r.closure}>
              <p className="text-xs" style={{ paddingLeft: INSET.left }}>
                <span className="font-medium">{r.kind === "standing" ? `Barrier of ${r.name}` : r.name}</span>
                <span className="text-muted">
                  {" "}
                  — {r.lanes.join(", ")} · {r.kind === "standing" ? "standing" : "short-term"}
                  {p50.has(r.closure) ? ` · ${h(p50.get(r.closure)!)} P50` : ""}
                </span>
              </p>
              <div className="relative h-3.5 rounded-sm bg-paper" style={{ marginLeft: INSET.left, marginRight: INSET.right }}>
                {width > 0 && <StripRow bars={r.bars.map(frac)} width={width} height={ROW_PX} fill={STANDING} pattern={r.kind === "standing" ? undefined : `hatch-${r.closure.replace(/[^a-zA-Z0-9_-]/g, "_")}`} />}
              </div>
            </div>
          ))}
          <div>
            <p className="text-xs font-medium" style={{ paddingLeft: INSET.left }}>
              Lanes closed at once <span className="font-normal text-muted">(bar height: 1 to {maxLanes} lanes)</span>
            </p>
            <div className="relative h-6 rounded-sm bg-paper" style={{ marginLeft: INSET.left, marginRight: INSET.right }}>
              {width > 0 && <StripRow bars={union.map(frac)} width={width} height={UNION_PX} fill="color-mix(in srgb, var(--color-ink) 70%, transparent)" heightOf={(k) => union[k].lanes.length / maxLanes} />}
            </div>
          </div>
        </div>
      )}
      {/* A table ignores the width sr-only sets, so it hides inside a block that honours it. */}
      <div className="sr-only">
      <table data-testid="closure-table">
        <caption>Closures in the representative iteration</caption>
        <thead>
          <tr>
            <th scope="col">Closure</th>
            <th scope="col">Kind</th>
            <th scope="col">Lanes</th>
            <th scope="col">Times set up</th>
            <th scope="col">First set up</th>
            <th scope="col">Last taken down</th>
            <th scope="col">Lane-closed hours</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.closure}>
              <th scope="row">{r.name}</th>
              <td>{r.kind === "standing" ? "standing (round the clock)" : "short-term"}</td>
              <td>{r.lanes.join(", ")}</td>
              <td>{r.periods}</td>
              <td>{when(r.first)}</td>
              <td>{when(r.last)}</td>
              <td>{h(r.laneHours)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
    </div>
  );
}
