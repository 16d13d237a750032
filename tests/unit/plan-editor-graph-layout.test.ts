// The sequence graph's layout: no two operations overlap, and every link runs forward (left to right).
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { layoutGraph, NODE_HEIGHT, NODE_WIDTH } from "@/components/plan-editor/graph-layout";

const overlap = (a: { x: number; y: number }, b: { x: number; y: number }) => Math.abs(a.x - b.x) < NODE_WIDTH && Math.abs(a.y - b.y) < NODE_HEIGHT;

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
  it("places the seven-operation chain in one row, left to right", () => {
    const ids = ["setup", "milling", "hydro", "cleanup", "placement", "cure", "striping"];
    const pos = layoutGraph(ids, ids.slice(1).map((to, i) => ({ from: ids[i], to })));
    for (let i = 1; i < ids.length; i++) {
      expect(pos[ids[i]].x).toBeGreaterThanOrEqual(pos[ids[i - 1]].x + NODE_WIDTH);
      expect(pos[ids[i]].y).toBe(pos[ids[0]].y);
    }
  });
  it("puts an operation added with no links beside the others, not on top of one", () => {
    const pos = layoutGraph(["a", "b", "new"], [{ from: "a", to: "b" }]);
    expect(overlap(pos.new, pos.a)).toBe(false);
    expect(overlap(pos.new, pos.b)).toBe(false);
  });
  it("never overlaps two operations and always runs a link forward, for any acyclic plan", () => {
    fc.assert(
      fc.property(dag, ({ ids, links }) => {
        const pos = layoutGraph(ids, links);
        for (let i = 0; i < ids.length; i++) for (let j = i + 1; j < ids.length; j++) expect(overlap(pos[ids[i]], pos[ids[j]]), `${ids[i]} / ${ids[j]}`).toBe(false);
        for (const l of links) expect(pos[l.to].x).toBeGreaterThan(pos[l.from].x);
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
