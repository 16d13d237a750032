/**
 * Series styling shared by every results chart: the Okabe–Ito colours of globals.css (ordered so the first
 * few have the strongest contrast on white; yellow last) each paired with a dash pattern, so lines still
 * differ in grey-scale print or for readers who do not see the colour.
 */
export const SERIES_COLORS = [
  "var(--color-s5)",
  "var(--color-s6)",
  "var(--color-s3)",
  "var(--color-s7)",
  "var(--color-s1)",
  "var(--color-s8)",
  "var(--color-s2)",
  "var(--color-s4)",
];

/** SVG stroke-dasharray values; "" is solid. */
export const SERIES_DASHES = ["", "8 4", "2 3", "10 3 2 3", "5 5", "1 4", "12 4 4 4", "3 2 8 2"];

export function seriesStyle(i: number): { stroke: string; strokeDasharray: string } {
  // Colours and dashes cycle at different points, so no two of the first 40 series look the same.
  return { stroke: SERIES_COLORS[i % SERIES_COLORS.length], strokeDasharray: SERIES_DASHES[(i + Math.floor(i / SERIES_COLORS.length)) % SERIES_DASHES.length] };
}

export const AXIS_TICK = { fontSize: 12, fill: "var(--color-muted)" };
export const GRID_STROKE = "var(--color-line)";
