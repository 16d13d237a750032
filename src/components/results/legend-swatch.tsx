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
