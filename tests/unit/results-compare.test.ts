// Compare: the ids parameter, and differences from the first scenario in days, points, hours and shifts.
import { describe, expect, it } from "vitest";
import { compareRows, dayDiff, olderRulesNotice, reforecastNotice, reforecastText, signed } from "@/components/results/compare-logic";
import { parseCompareIds, type CompareReforecast, type CompareRun, type CompareScenario } from "@/lib/compare-contract";
import { dateTicks } from "@/components/results/date-axis";
import { civilFromDays, daysFromCivil } from "@sim/dates";

function run(over: Partial<CompareRun> = {}): CompareRun {
  return {
    id: "r",
    scenarioVersion: 1,
    stale: false,
    olderRules: false,
    verification: "server",
    iterations: 500,
    createdAt: "2026-01-01T00:00:00Z",
    startDate: "2027-04-05",
    unfinishedIterations: 0,
    finish: { p10: "2027-09-20", p50: "2027-10-01", p80: "2027-10-10", p90: "2027-10-20" },
    finishAt: { p10: "2027-09-20T10:00", p50: "2027-10-01T10:00", p80: "2027-10-10T10:00", p90: "2027-10-20T10:00" },
    cdf: [],
    target: { date: "2027-10-05", probability: 0.4 },
    weatherLostShifts: { p50: 6, p80: 9 },
    closureHoursTotal: 400,
    ...over,
  };
}
const sc = (id: string, r: CompareRun | null): CompareScenario => ({ id, name: id, version: 1, run: r, reforecast: null });

describe("parseCompareIds", () => {
  it("accepts 1–4 distinct ids, trimming blanks", () => {
    expect(parseCompareIds(" a, b ,,c")).toEqual({ ok: true, ids: ["a", "b", "c"] });
  });
  it("refuses none, more than four, and repeats", () => {
    expect(parseCompareIds("").ok).toBe(false);
    expect(parseCompareIds(null).ok).toBe(false);
    expect(parseCompareIds("a,b,c,d,e").ok).toBe(false);
    expect(parseCompareIds("a,b,a").ok).toBe(false);
    expect(parseCompareIds("a,b,c,d").ok).toBe(true);
  });
});

describe("differences", () => {
  it("signed with units and a true minus sign", () => {
    expect(signed(12, "d")).toBe("+12 d");
    expect(signed(-3, "d")).toBe("\u22123 d");
    expect(signed(0, "h")).toBe("±0 h");
    expect(signed(4.96, "pp")).toBe("+5 pp");
    expect(signed(1234.4, "h")).toBe("+1,234 h");
  });
  it("dayDiff counts calendar days across a month end, and is null for unfinished", () => {
    expect(dayDiff("2027-09-28", "2027-10-10")).toBe(12);
    expect(dayDiff("2027-10-10T23:00", "2027-10-09")).toBe(-1); // the time of day is ignored: dates, not hours
    expect(dayDiff("unfinished", "2027-10-10")).toBeNull();
  });

  it("rows: first scenario has no difference; later ones differ from it; no run reads 'not run yet'", () => {
    const rows = compareRows([
      sc("A", run()),
      sc("B", run({ finish: { p10: "2027-09-21", p50: "2027-10-13", p80: "2027-10-22", p90: "unfinished" }, target: { date: "2027-10-05", probability: 0.25 }, closureHoursTotal: 388, weatherLostShifts: { p50: 8, p80: 10 } })),
      sc("C", null),
    ]);
    const row = (id: string) => rows.find((r) => r.id === id)!;
    expect(row("p50").cells.map((c) => c.diff)).toEqual([null, "+12 d", null]);
    expect(row("p80").cells[1]).toEqual({ text: "22 Oct 2027", diff: "+12 d" });
    expect(row("p90").cells[1]).toEqual({ text: "not reached", diff: null });
    expect(row("target").cells[1]).toEqual({ text: "25 % by 5 Oct 2027", diff: "\u221215 pp" });
    expect(row("closureHours").cells[1].diff).toBe("\u221212 h");
    expect(row("weatherLost").cells[1].diff).toBe("+2 shifts");
    expect(rows.every((r) => r.cells[2].text === "not run yet" && r.cells[2].diff === null)).toBe(true);
  });

  it("target probabilities for different target dates are not subtracted", () => {
    const rows = compareRows([sc("A", run()), sc("B", run({ target: { date: "2027-11-01", probability: 0.9 } }))]);
    expect(rows.find((r) => r.id === "target")!.cells[1].diff).toBeNull();
  });

  it("without a run for the first scenario, nothing has a difference", () => {
    const rows = compareRows([sc("A", null), sc("B", run())]);
    expect(rows.every((r) => r.cells[1].diff === null)).toBe(true);
  });
});

describe("dateTicks", () => {
  it("short spans tick on days, each tick inside the span", () => {
    const lo = daysFromCivil(2027, 10, 1);
    const t = dateTicks(lo, lo + 6, 8);
    expect(t.ticks).toEqual([0, 1, 2, 3, 4, 5, 6].map((d) => lo + d));
    expect(t.label(lo)).toBe("1 Oct 2027");
    expect(t.label(lo + 1)).toBe("2 Oct");
  });
  it("long spans tick on the first of months, at most maxTicks, covering the span", () => {
    const lo = daysFromCivil(2027, 4, 5);
    const hi = daysFromCivil(2028, 8, 20);
    const t = dateTicks(lo, hi, 8);
    expect(t.ticks.length).toBeLessThanOrEqual(8);
    expect(t.ticks.length).toBeGreaterThanOrEqual(4);
    for (const z of t.ticks) {
      expect(civilFromDays(z).d).toBe(1);
      expect(z).toBeGreaterThanOrEqual(lo);
      expect(z).toBeLessThanOrEqual(hi);
    }
    expect(t.label(daysFromCivil(2027, 10, 1))).toBe("Oct 2027");
  });
});

describe("a re-forecast beside the plan runs compared", () => {
  const reforecast = (over: Partial<CompareReforecast> = {}): CompareReforecast => ({
    dataDate: "2026-10-31",
    createdAt: "2026-11-01T11:00:00Z",
    p50: "2027-08-15",
    p80: "2027-08-23",
    targetDate: "2027-07-02",
    targetProbability: 0,
    stale: false,
    olderRules: false,
    ...over,
  });

  it("says its P80, P50, chance of the target and data date in the project list's words", () => {
    expect(reforecastText(reforecast())).toBe("P80 23 Aug 2027 (P50 15 Aug 2027), 0\u00a0% chance of finishing by the 2 Jul 2027 target, from the work recorded up to 31 Oct 2026");
    expect(reforecastText(reforecast({ targetDate: null, targetProbability: null, stale: true }))).toBe(
      "P80 23 Aug 2027 (P50 15 Aug 2027), from the work recorded up to 31 Oct 2026 (the plan has changed since, so it is stale until the next one)",
    );
    expect(reforecastText(reforecast({ olderRules: true }))).toBe(
      "P80 23 Aug 2027 (P50 15 Aug 2027), 0\u00a0% chance of finishing by the 2 Jul 2027 target, from the work recorded up to 31 Oct 2026 (computed under earlier model rules)",
    );
    expect(reforecastText(reforecast({ p80: "unfinished" }))).toMatch(/^P80 not reached within the six-year horizon \(P50 15 Aug 2027\)/);
  });

  it("is said above the figures only when a chosen scenario has one, naming each that has", () => {
    expect(reforecastNotice([sc("a", run()), sc("b", run())])).toBeNull();
    const notice = reforecastNotice([sc("plain", run()), { ...sc("Under way", run()), reforecast: reforecast() }]);
    expect(notice?.lead).toMatch(/plan runs from each plan's start date, which know nothing of the work done/);
    expect(notice?.lines).toEqual([`Under way has been re-forecast from its field log: ${reforecastText(reforecast())}.`]);
  });
});

describe("runs of earlier model rules among those compared", () => {
  it("are named, and the notice says the differences are partly the rules' when today's runs are beside them", () => {
    expect(olderRulesNotice([sc("A", run()), sc("B", run())])).toBeNull();
    expect(olderRulesNotice([sc("A", run({ olderRules: true })), sc("B", run())])).toBe(
      "The latest plan run of A was computed under earlier model rules, so the differences below are partly the rules'. A new run of it compares under today's rules.",
    );
    expect(olderRulesNotice([sc("A", run({ olderRules: true })), sc("B", run({ olderRules: true })), sc("C", run({ olderRules: true }))])).toBe(
      "The latest plan runs of A, B and C were computed under earlier model rules. A new run of each compares under today's rules.",
    );
  });
});
