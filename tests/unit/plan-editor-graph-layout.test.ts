// The sequence graph's layout: no two operations overlap, and every link runs forward in reading order (to the
// right within a row, or on to a later row); long chains fold into rows of at most four columns.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { columnsFor, layoutGraph, MAX_COLUMNS_PER_ROW, NODE_HEIGHT, NODE_WIDTH, type GraphPosition } from "@/components/plan-editor/graph-layout";

const overlap = (a: { x: number; y: number }, b: { x: number; y: number }) => Math.abs(a.x - b.x) < NODE_WIDTH && Math.abs(a.y - b.y) < NODE_HEIGHT;
/** Reading order: a later row, or the same row further right. */
const forward = (a: GraphPosition, b: GraphPosition) => b.row > a.row || (b.row === a.row && b.x > a.x);

/** A random acyclic graph: links only from a lower to a higher index. */
const dag = fc.integer({ min: 1, max: 14 }).chain((n) =>
  fc.record({
    ids: fc.constant(Array.from({ length: n }, (_, i) => `op${i}`)),
    links: fc
      .uniqueArray(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: n * 2, selector: ([a, b]) => `${Math.min(a, b)}-${Math.max(a, b)}` })
      .map((ps) => ps.filter(([a, b]) => a !== b).map(([a, b]) => ({ from: `op${Math.min(a, b)}`, to: `op${Math.max(a, b)}` }))),
  }),
);

describe("layoutGraph", () => {
  it("folds the seven-operation chain into two rows, four then three, each left to right, the second below the first", () => {
    const ids = ["setup", "milling", "hydro", "cleanup", "placement", "cure", "striping"];
    const pos = layoutGraph(ids, ids.slice(1).map((to, i) => ({ from: ids[i], to })));
    expect(ids.map((id) => pos[id].row)).toEqual([0, 0, 0, 0, 1, 1, 1]);
    for (let i = 1; i < ids.length; i++) {
      if (pos[ids[i]].row !== pos[ids[i - 1]].row) continue;
      expect(pos[ids[i]].x).toBeGreaterThanOrEqual(pos[ids[i - 1]].x + NODE_WIDTH);
      expect(pos[ids[i]].y).toBe(pos[ids[i - 1]].y);
    }
    // Each row starts at the left edge; the second lies wholly below the first.
    expect(pos.placement.x).toBe(pos.setup.x);
    expect(pos.placement.y).toBeGreaterThanOrEqual(pos.setup.y + NODE_HEIGHT);
  });
  it("takes the row length from the graph's width: four on a desktop, three on a tablet, two on a phone", () => {
    expect(columnsFor(1010)).toBe(4); // the plan editor's graph at 1,400 px
    expect(columnsFor(700)).toBe(3); // a 768 px tablet
    expect(columnsFor(350)).toBe(2); // a 390 px phone: still two, or the graph is drawn tiny
    expect(columnsFor(0)).toBe(2);
    const ids = ["setup", "milling", "hydro", "cleanup", "placement", "cure", "striping"];
    const pos = layoutGraph(ids, ids.slice(1).map((to, i) => ({ from: ids[i], to })), undefined, 2);
    expect(ids.map((id) => pos[id].row)).toEqual([0, 0, 1, 1, 2, 2, 3]);
  });
  it("keeps a chain of four or fewer in one row", () => {
    const ids = ["a", "b", "c", "d"];
    const pos = layoutGraph(ids, ids.slice(1).map((to, i) => ({ from: ids[i], to })));
    expect(ids.map((id) => pos[id].row)).toEqual([0, 0, 0, 0]);
  });
  it("spreads columns evenly over the rows: five make three and two, nine make three rows of three", () => {
    const chain = (n: number) => {
      const ids = Array.from({ length: n }, (_, i) => `op${i}`);
      const pos = layoutGraph(ids, ids.slice(1).map((to, i) => ({ from: ids[i], to })));
      const perRow = new Map<number, number>();
      for (const id of ids) perRow.set(pos[id].row, (perRow.get(pos[id].row) ?? 0) + 1);
      return [...perRow.values()];
    };
    expect(chain(5)).toEqual([3, 2]);
    expect(chain(9)).toEqual([3, 3, 3]);
  });
  it("puts an operation added with no links beside the others, not on top of one", () => {
    const pos = layoutGraph(["a", "b", "new"], [{ from: "a", to: "b" }]);
    expect(overlap(pos.new, pos.a)).toBe(false);
    expect(overlap(pos.new, pos.b)).toBe(false);
  });
  it("never overlaps two operations, runs every link forward in reading order and fills at most the row length asked for, for any acyclic plan and row length", () => {
    fc.assert(
      fc.property(dag, fc.integer({ min: 2, max: MAX_COLUMNS_PER_ROW }), ({ ids, links }, perRow) => {
        const pos = layoutGraph(ids, links, undefined, perRow);
        for (let i = 0; i < ids.length; i++) for (let j = i + 1; j < ids.length; j++) expect(overlap(pos[ids[i]], pos[ids[j]]), `${ids[i]} / ${ids[j]}`).toBe(false);
        for (const l of links) expect(forward(pos[l.from], pos[l.to]), `${l.from} → ${l.to}`).toBe(true);
        const rows = new Map<number, Set<number>>();
        for (const id of ids) rows.set(pos[id].row, (rows.get(pos[id].row) ?? new Set()).add(pos[id].x));
        for (const xs of rows.values()) expect(xs.size).toBeLessThanOrEqual(perRow);
      }),
      { numRuns: 100 },
    );
  });
  it("ignores a link to an operation that is not in the plan (stored data may hold one)", () => {
    const pos = layoutGraph(["a"], [{ from: "a", to: "ghost" }]);
    expect(Object.keys(pos)).toEqual(["a"]);
  });
  it("lays out a stored loop too (the editor refuses new loops, but must still open such a plan)", () => {
    const pos = layoutGraph(["a", "b"], [{ from: "a", to: "b" }, { from: "b", to: "a" }]);
    expect(overlap(pos.a, pos.b)).toBe(false);
  });
});
