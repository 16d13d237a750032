// Compare: delay and cost rows with differences from the first scenario; "—" where a run has no such figure.
import { describe, expect, it } from "vitest";
import { compareRows } from "@/components/results/compare-logic";
import type { CompareRun, CompareScenario } from "@/lib/compare-contract";

function run(over: Partial<CompareRun> = {}): CompareRun {
  return {
    id: "r", scenarioVersion: 1, stale: false, olderRules: false, verification: "server", iterations: 500, createdAt: "2026-01-01T00:00:00Z", startDate: "2027-04-05",
    unfinishedIterations: 0,
    finish: { p10: "2027-09-20", p50: "2027-10-01", p80: "2027-10-10", p90: "2027-10-20" },
    finishAt: { p10: "2027-09-20T10:00", p50: "2027-10-01T10:00", p80: "2027-10-10T10:00", p90: "2027-10-20T10:00" },
    cdf: [], target: null, weatherLostShifts: { p50: 6, p80: 9 }, closureHoursTotal: 400,
    ...over,
  };
}
/** P50 and P80 as the run summary has them (its mean is not compared). */
const q = (p50: number, p80: number) => ({ p50, p80, mean: null });
const sc = (id: string, r: CompareRun | null): CompareScenario => ({ id, name: id, version: 1, run: r, reforecast: null });

describe("delay and cost rows", () => {
  it("show P50/P80 delay, road-user and contract cost with signed differences", () => {
    const a = run({ delay: { vehicleHours: q(450000, 500000) }, cost: { valueOfTimeYear: 2026, roadUser: q(9_500_000, 10_000_000), contract: q(7_200_000, 7_500_000) } });
    const b = run({ delay: { vehicleHours: q(470500, 495000) }, cost: { valueOfTimeYear: 2026, roadUser: q(9_900_000, 9_950_000), contract: q(7_000_000, 7_500_000) } });
    const rows = new Map(compareRows([sc("A", a), sc("B", b)]).map((r) => [r.id, r.cells]));
    expect(rows.get("delayP50")).toEqual([{ text: "450,000 veh-h", diff: null }, { text: "470,500 veh-h", diff: "+20,500 veh-h" }]);
    expect(rows.get("delayP80")![1].diff).toBe("\u22125,000 veh-h");
    expect(rows.get("roadUserP50")![1]).toEqual({ text: "$9,900,000", diff: "+$400,000" });
    expect(rows.get("contractP50")![1].diff).toBe("\u2212$200,000");
    expect(rows.get("contractP80")![1].diff).toBe("±$0");
  });

  it("a run without traffic reads — and gives no difference", () => {
    const a = run({ delay: { vehicleHours: q(100, 200) }, cost: { valueOfTimeYear: 2026, roadUser: q(2000, 4000), contract: null } });
    const b = run();
    const rows = new Map(compareRows([sc("A", a), sc("B", b)]).map((r) => [r.id, r.cells]));
    expect(rows.get("delayP50")![1]).toEqual({ text: "—", diff: null });
    expect(rows.get("contractP50")![0]).toEqual({ text: "—", diff: null });
    expect(rows.get("roadUserP80")![0].text).toBe("$4,000");
  });
});
