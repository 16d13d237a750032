import { describe, expect, it } from "vitest";
import { chartPoints, costShade, filterRows } from "@/components/search/search-logic";
import type { VariantRow } from "@/lib/search-contract";

const row = (idx: number, p80: string | null, over: Partial<VariantRow> = {}): VariantRow => ({
  idx,
  label: `v${idx}`,
  status: p80 ? "done" : "pending",
  outcome: p80 ? { p80Finish: p80, targetProbability: 0.5, delayVehHours: idx * 10, contractCost: idx * 1000 } : null,
  problem: null,
  current: idx === 0,
  onFrontier: false,
  ...over,
});

describe("search table and chart rows", () => {
  const rows = [row(0, "2028-07-01"), row(1, "2028-06-01", { onFrontier: true }), row(2, "unfinished"), row(3, null)];

  it("filters to plans finishing by the target at P80 (unfinished and running plans are out)", () => {
    expect(filterRows(rows, { p80By: "2028-06-30", frontierOnly: false }).map((r) => r.idx)).toEqual([1]);
    expect(filterRows(rows, { p80By: null, frontierOnly: false })).toHaveLength(4);
  });

  it("keeps the plan as saved beside the frontier when showing the frontier only", () => {
    expect(filterRows(rows, { p80By: null, frontierOnly: true }).map((r) => r.idx)).toEqual([0, 1]);
  });

  it("charts finished plans with a date only", () => {
    expect(chartPoints(rows).map((p) => p.idx)).toEqual([0, 1]);
  });

  it("shades cost from cheapest (0) to dearest (1)", () => {
    const shade = costShade(chartPoints(rows));
    expect(shade(0)).toBe(0);
    expect(shade(1000)).toBe(1);
    expect(costShade([])(5)).toBeNull();
  });
});
