/** Where a chart will be drawn a moment later (results/use-staged.ts): its height, so nothing below jumps. */
export function ChartPlaceholder({ height }: { height: number }) {
  return <div aria-hidden="true" className="rounded-md bg-paper/60" style={{ height }} data-chart-placeholder="" />;
}
