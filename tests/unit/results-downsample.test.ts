/**
 * Drawing reductions of the results charts (src/components/results/downsample.ts): the M4 reduction keeps,
 * per pixel column of each unbroken piece, the first, last, lowest and highest point — checked here against a
 * brute-force grouping of the whole input — and the bars and lines come back out of their SVG paths as drawn.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { barsPath, downsampleLine, linePath, type LinePoint } from "../../src/components/results/downsample";

interface Group {
  column: number;
  first: LinePoint;
  last: LinePoint;
  min: number;
  max: number;
}

/** Brute force: the pieces (split at breaks) and, in each, the runs of consecutive points in one column. */
function groupsOf(points: readonly LinePoint[], columnOf: (x: number) => number): Group[][] {
  const pieces: LinePoint[][] = [];
  let piece: LinePoint[] = [];
  for (const p of points) {
    if (p.y === null) {
      if (piece.length) pieces.push(piece);
      piece = [];
    } else piece.push(p);
  }
  if (piece.length) pieces.push(piece);
  return pieces.map((pc) => {
    const groups: Group[] = [];
    for (const p of pc) {
      const g = groups[groups.length - 1];
      const y = p.y as number;
      if (g && g.column === columnOf(p.x)) {
        g.last = p;
        g.min = Math.min(g.min, y);
        g.max = Math.max(g.max, y);
      } else groups.push({ column: columnOf(p.x), first: p, last: p, min: y, max: y });
    }
    return groups;
  });
}

const point = fc.record({
  x: fc.double({ min: 0, max: 50, noNaN: true }),
  y: fc.option(fc.double({ min: -1000, max: 1000, noNaN: true }), { freq: 6, nil: null }),
});
const width = fc.constantFrom(0.5, 1, 3, 10);

describe("downsampleLine (M4 per pixel column)", () => {
  it("keeps every piece and, per column run, its first, last, lowest and highest point — as a brute-force grouping says", () => {
    fc.assert(
      fc.property(fc.array(point, { maxLength: 300 }), width, fc.boolean(), (raw, w, sortByX) => {
        const points = sortByX ? [...raw].sort((a, b) => a.x - b.x) : raw;
        const columnOf = (x: number) => Math.floor(x / w);
        const out = downsampleLine(points, columnOf);
        const want = groupsOf(points, columnOf);
        const got = groupsOf(out, columnOf);
        expect(got.length).toBe(want.length);
        got.forEach((pieceGroups, i) => {
          expect(pieceGroups.map((g) => g.column)).toEqual(want[i].map((g) => g.column));
          pieceGroups.forEach((g, k) => {
            const h = want[i][k];
            expect(g.first).toBe(h.first);
            expect(g.last).toBe(h.last);
            expect(g.min).toBe(h.min);
            expect(g.max).toBe(h.max);
          });
        });
        // Nothing invented or reordered: the output is a subsequence of the input.
        let at = 0;
        for (const p of out) {
          while (at < points.length && points[at] !== p) at++;
          expect(at).toBeLessThan(points.length);
          at++;
        }
        const groups = want.reduce((s, g) => s + g.length, 0);
        expect(out.length).toBeLessThanOrEqual(4 * groups + Math.max(0, want.length - 1));
      }),
    );
  });

  it("a run of points in one column comes down to its first, lowest, highest and last (hand-worked)", () => {
    const pts = [
      { x: 0.1, y: 5 },
      { x: 0.2, y: 1 },
      { x: 0.3, y: 9 },
      { x: 0.4, y: 4 },
      { x: 0.5, y: 6 },
      { x: 1.2, y: 7 },
    ];
    expect(downsampleLine(pts, Math.floor)).toEqual([pts[0], pts[1], pts[2], pts[4], pts[5]]);
  });

  it("leaves a line with no column visited by more than four consecutive points as it was, breaks included", () => {
    const pts: LinePoint[] = [
      { x: 0, y: 1 },
      { x: 1, y: 2 },
      { x: 1.5, y: null },
      { x: 2, y: 2 },
      { x: 3, y: 0 },
    ];
    expect(downsampleLine(pts, Math.floor)).toEqual(pts);
  });

  it("drops breaks with nothing to separate (leading, trailing, doubled)", () => {
    const a = { x: 0, y: 1 };
    const b = { x: 5, y: 2 };
    expect(downsampleLine([{ x: 0, y: null }, a, { x: 1, y: null }, { x: 2, y: null }, b, { x: 6, y: null }], Math.floor)).toEqual([a, { x: 1, y: null }, b]);
  });
});

describe("linePath and barsPath", () => {
  it("a line with a break is two subpaths", () => {
    expect(linePath([{ x: 0, y: 10 }, { x: 5.04, y: 2.26 }, { x: 6, y: null }, { x: 7, y: 1 }, { x: 8, y: 0 }])).toBe("M0 10L5 2.3 M7 1L8 0");
  });

  /** The rectangles a barsPath string draws, read back. */
  function rects(d: string) {
    return [...d.matchAll(/M(-?[\d.]+) (-?[\d.]+)H(-?[\d.]+)V(-?[\d.]+)H(-?[\d.]+)Z/g)].map((m) => ({ x1: Number(m[1]), top: Number(m[2]), x2: Number(m[3]), bottom: Number(m[4]) }));
  }

  it("draws each bar with height from its top to the baseline, at least the minimum width, as one path", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x1: fc.integer({ min: 0, max: 900 }), w: fc.double({ min: 0, max: 30, noNaN: true }), y: fc.integer({ min: 0, max: 300 }) }), { maxLength: 60 }),
        fc.double({ min: 0.5, max: 4, noNaN: true }),
        (bars, minWidth) => {
          const baseline = 300;
          const drawn = rects(barsPath(bars.map((b) => ({ x1: b.x1, x2: b.x1 + b.w, y: b.y })), baseline, minWidth));
          const visible = bars.filter((b) => b.y < baseline);
          expect(drawn.length).toBe(visible.length);
          drawn.forEach((r, i) => {
            const b = visible[i];
            const w = Math.max(b.w, minWidth);
            const mid = b.x1 + b.w / 2;
            // Rounded to 0.1 px in the path.
            expect(Math.abs(r.x1 - (mid - w / 2))).toBeLessThanOrEqual(0.051);
            expect(Math.abs(r.x2 - (mid + w / 2))).toBeLessThanOrEqual(0.051);
            expect(r.top).toBe(b.y);
            expect(r.bottom).toBe(baseline);
          });
        },
      ),
    );
  });
});
