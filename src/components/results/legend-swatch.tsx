import type { ReactNode } from "react";

/** A small line sample for HTML legends: the series' colour and dash, drawn as SVG (decorative). */
export function LineSwatch({ stroke, strokeDasharray, width = 28 }: { stroke: string; strokeDasharray?: string; width?: number }) {
  return (
    <svg width={width} height="10" aria-hidden="true" className="shrink-0">
      <line x1="0" y1="5" x2={width} y2="5" stroke={stroke} strokeWidth="2.5" strokeDasharray={strokeDasharray || undefined} />
    </svg>
  );
}

export function AreaSwatch({ className }: { className: string }) {
  return <span aria-hidden="true" className={`inline-block h-3 w-5 shrink-0 rounded-sm border border-line ${className}`} />;
}

/** One entry of a chart's HTML legend: a line sample (stroke, dash) or a filled block (fill). */
export interface LegendItem {
  label: ReactNode;
  line?: { stroke: string; strokeDasharray?: string };
  fill?: string;
}

/**
 * A chart's legend as a list in ink below the chart, one sample per series — what every chart here uses instead
 * of the chart library's own legend (which writes each name in its series' colour).
 */
export function ChartLegend({ items }: { items: LegendItem[] }) {
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-1 text-xs" aria-label="Legend">
      {items.map((it, i) => (
        <li key={i} className="flex items-center gap-1.5">
          {it.line ? <LineSwatch {...it.line} /> : <span aria-hidden="true" className="inline-block h-3 w-5 shrink-0 rounded-sm" style={{ background: it.fill }} />}
          {it.label}
        </li>
      ))}
    </ul>
  );
}
