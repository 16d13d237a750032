/**
 * Lines and bars reduced to what a chart can show, and written as SVG path data.
 *
 * `downsampleLine` keeps, for every pixel column an unbroken piece of a line passes through, the first, the
 * last, the lowest and the highest of its points there (the "M4" reduction: a line drawn through those four
 * per column covers the same pixels as one drawn through them all), so a series of any length costs at most
 * four points per column. Breaks (a point with `y: null`) are kept where they are: gaps stay gaps.
 *
 * `barsPath` draws many bars as one path (one element instead of one per bar); `linePath` one line with
 * breaks. Both take pixel coordinates.
 */

export interface LinePoint {
  x: number;
  /** null: the line breaks here (the previous piece ends, the next begins after it). */
  y: number | null;
}

/**
 * The points to draw: a subsequence of `points` in their order. `columnOf(x)` names the pixel column of an x
 * (e.g. Math.floor of the pixel x). Within each piece, consecutive points in one column form a group, and of
 * each group the first, lowest, highest and last point are kept (once each, in their original order).
 */
export function downsampleLine<P extends LinePoint>(points: readonly P[], columnOf: (x: number) => number): P[] {
  const out: P[] = [];
  let i = 0;
  const n = points.length;
  while (i < n) {
    const p = points[i];
    if (p.y === null) {
      // A break: one is enough, and none at the start or twice in a row (nothing to separate).
      if (out.length > 0 && out[out.length - 1].y !== null) out.push(p);
      i++;
      continue;
    }
    // One group: consecutive drawn points of the same column.
    const col = columnOf(p.x);
    let j = i;
    let lo = i;
    let hi = i;
    while (j + 1 < n && points[j + 1].y !== null && columnOf(points[j + 1].x) === col) {
      j++;
      if ((points[j].y as number) < (points[lo].y as number)) lo = j;
      if ((points[j].y as number) > (points[hi].y as number)) hi = j;
    }
    const keep = [i, lo, hi, j].sort((a, b) => a - b);
    for (let k = 0; k < keep.length; k++) if (k === 0 || keep[k] !== keep[k - 1]) out.push(points[keep[k]]);
    i = j + 1;
  }
  if (out.length > 0 && out[out.length - 1].y === null) out.pop();
  return out;
}

const r = (v: number) => Math.round(v * 10) / 10;

/** "M x y L x y …", a new "M" after each break; pixel coordinates rounded to 0.1 px. */
export function linePath(points: readonly LinePoint[]): string {
  let d = "";
  let pen = false;
  for (const p of points) {
    if (p.y === null) {
      pen = false;
      continue;
    }
    d += `${pen ? "L" : d ? " M" : "M"}${r(p.x)} ${r(p.y)}`;
    pen = true;
  }
  return d;
}

export interface PixelBar {
  x1: number;
  x2: number;
  /** The top of the bar (pixels: smaller is higher). */
  y: number;
}

/**
 * Rectangles from each bar's top down to `baseline`, as one path. A bar narrower than `minWidth` pixels is
 * widened about its middle, so a short day on a long axis stays visible; a bar of no height is left out.
 */
export function barsPath(bars: readonly PixelBar[], baseline: number, minWidth = 1): string {
  const parts: string[] = [];
  for (const b of bars) {
    let x1 = Math.min(b.x1, b.x2);
    let x2 = Math.max(b.x1, b.x2);
    if (x2 - x1 < minWidth) {
      const mid = (x1 + x2) / 2;
      x1 = mid - minWidth / 2;
      x2 = mid + minWidth / 2;
    }
    const top = Math.min(b.y, baseline);
    const height = Math.abs(baseline - b.y);
    if (!(height > 0)) continue;
    parts.push(`M${r(x1)} ${r(top)}H${r(x2)}V${r(top + height)}H${r(x1)}Z`);
  }
  return parts.join("");
}
