// The results' stage views: the trace split by stage (one operation style across stages) and the closure
// strip read off the closure timeline (rows, clipping, and lanes closed at once counted as a union).
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { Trace } from "@sim/engine";
import { parseScenario, runScenario } from "@sim/index";
import type { ClosurePeriodSummary } from "@sim/summary-closures";
import { closureRows, lanesClosed } from "@/components/results/closure-strip";
import { isoToDay } from "@/components/results/date-axis";
import { seriesByStage } from "@/components/results/stage-series";
import { stageLabel, stageSentence } from "@/lib/stage-text";

const deck = { startStationFt: 0, lengthFt: 200, packetFt: 100 };
const ops = [
  { id: "mill", name: "Milling" },
  { id: "pour", name: "Placement" },
];
const id = (h: number) => h;

describe("seriesByStage", () => {
  it("splits packets and pauses by stage; an operation keeps its style index in every stage", () => {
    const trace: Trace = {
      packets: [
        { op: "mill", stage: "s1", packet: 0, crew: 0, start: 0, finish: 10 },
        { op: "pour", stage: "s1", packet: 0, crew: 0, start: 10, finish: 12 },
        { op: "mill", stage: "s2", packet: 0, crew: 0, start: 20, finish: 40 },
      ],
      // A pause of s2's milling on packet 0 must not cut s1's milling of the same packet.
      pauses: [{ op: "mill", stage: "s2", packet: 0, crew: 0, start: 25, end: 35, reason: "closed" }],
    };
    const groups = seriesByStage(trace, deck, [{ id: "s1", name: "Stage one" }, { id: "s2", name: "Stage two" }], ops, id);
    expect(groups.map((g) => g.stage?.name)).toEqual(["Stage one", "Stage two"]);
    expect(groups[0].series.map((s) => [s.id, s.styleIndex])).toEqual([["mill", 0], ["pour", 1]]);
    expect(groups[1].series.map((s) => [s.id, s.styleIndex])).toEqual([["mill", 0]]);
    expect(groups[0].series[0].pieces).toBe(1);
    expect(groups[1].series[0].pieces).toBe(2);
    expect(groups[1].series[0].pausedHours.closed).toBe(10);
  });

  it("a trace stored before stages is one group without a stage", () => {
    const trace: Trace = { packets: [{ op: "mill", packet: 1, crew: 0, start: 0, finish: 5 }], pauses: [] };
    const groups = seriesByStage(trace, deck, [{ id: "s1", name: "S1" }], ops, id);
    expect(groups).toHaveLength(1);
    expect(groups[0].stage).toBeNull();
    expect(groups[0].series[0].points).toEqual([{ x: 0, y: 100 }, { x: 5, y: 200 }]);
  });

  it("the staged demo: both stages have lines, each stage's packets only", () => {
    const p = parseScenario(JSON.parse(readFileSync(new URL("../../scenarios/kestrel-staged-three-lane.json", import.meta.url), "utf8")));
    if (!p.ok) throw new Error("demo invalid");
    const s = runScenario(p.scenario, { iterations: 3, seed: "td" });
    const groups = seriesByStage(s.representative.trace, p.scenario.deck, p.scenario.stages, p.scenario.operations, id);
    expect(groups.map((g) => g.stage?.id)).toEqual(["stage-1", "stage-2"]);
    for (const g of groups) {
      const count = s.representative.trace.packets.filter((t) => t.stage === g.stage!.id && Number.isFinite(t.finish)).length;
      expect(count).toBeGreaterThan(0);
      expect(g.series.some((x) => x.id === "placement-l1")).toBe(g.stage!.id === "stage-1");
    }
  });
});

const period = (closure: string, kind: "standing" | "short", lanes: string[], start: string, end: string): ClosurePeriodSummary => ({ closure, name: closure, kind, lanes, start, end });

describe("closure strip", () => {
  // Hand-worked: stage barrier on L1 from 1 Jun 08:00 to 3 Jun 08:00; a night closure of L1+L2 1 Jun 20:00–
  // 2 Jun 05:00 (L1 already closed: two lanes at once, not three); a second night 3 Jun 20:00–4 Jun 05:00.
  const timeline = [
    period("stage:s1", "standing", ["L1"], "2027-06-01T08:00", "2027-06-03T08:00"),
    period("night", "short", ["L1", "L2"], "2027-06-01T20:00", "2027-06-02T05:00"),
    period("night", "short", ["L1", "L2"], "2027-06-03T20:00", "2027-06-04T05:00"),
  ];
  const d = (iso: string) => isoToDay(iso)!;

  it("rows: standing first, periods clipped to the chart, lane-hours over the whole timeline", () => {
    const lo = d("2027-06-01T00:00");
    const hi = d("2027-06-04T00:00");
    const rows = closureRows(timeline, lo, hi);
    expect(rows.map((r) => [r.closure, r.kind, r.periods])).toEqual([["stage:s1", "standing", 1], ["night", "short", 2]]);
    expect(rows[1].bars).toEqual([{ x1: d("2027-06-01T20:00"), x2: d("2027-06-02T05:00") }, { x1: d("2027-06-03T20:00"), x2: hi }]);
    // 48 h × 1 lane; 2 nights × 9 h × 2 lanes.
    expect(rows[0].laneHours).toBeCloseTo(48, 6);
    expect(rows[1].laneHours).toBeCloseTo(36, 6);
    expect(rows[1].last).toBe("2027-06-04T05:00");
  });

  it("lanes closed at once: the union, one segment per change", () => {
    const segs = lanesClosed(timeline, d("2027-06-01T00:00"), d("2027-06-05T00:00"));
    expect(segs.map((s) => [s.lanes.join("+"), Math.round((s.x2 - s.x1) * 24)])).toEqual([
      ["L1", 12],
      ["L1+L2", 9],
      ["L1", 27],
      ["L1+L2", 9],
    ]);
    // The segments' lane-hours equal lane-closed hours as MODEL.md defines the total: 12 + 18 + 27 + 18.
    expect(segs.reduce((a, s) => a + s.lanes.length * (s.x2 - s.x1) * 24, 0)).toBeCloseTo(75, 6);
  });

  it("the staged demo's strip total agrees with the engine's lane-closed hours by day", () => {
    const p = parseScenario(JSON.parse(readFileSync(new URL("../../scenarios/kestrel-staged-three-lane.json", import.meta.url), "utf8")));
    if (!p.ok) throw new Error("demo invalid");
    const s = runScenario(p.scenario, { iterations: 3, seed: "strip" });
    const tl = s.representative.closureTimeline;
    const segs = lanesClosed(tl, -Infinity, Infinity);
    const strip = segs.reduce((a, x) => a + x.lanes.length * (x.x2 - x.x1) * 24, 0);
    const engine = s.laneClosedHours.byDay.reduce((a, x) => a + x.total, 0);
    expect(strip).toBeCloseTo(engine, 0);
    expect(closureRows(tl, -Infinity, Infinity).filter((r) => r.kind === "standing").map((r) => r.closure)).toEqual(["stage:stage-1", "stage:stage-2"]);
  });
});

describe("stage text", () => {
  it("a stage's label names its number once", () => {
    expect(stageLabel("North lanes", 1)).toBe("Stage 2: North lanes");
    expect(stageLabel("Stage 2: North lanes", 1)).toBe("Stage 2: North lanes");
    expect(stageLabel("stage 2 — north", 1)).toBe("stage 2 — north");
    // "Stage 12" is not stage 1.
    expect(stageLabel("Stage 12 lanes", 0)).toBe("Stage 1: Stage 12 lanes");
  });

  const load = (f: string) => {
    const p = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${f}`, import.meta.url), "utf8")));
    if (!p.ok) throw new Error(`${f} invalid`);
    return p.scenario;
  };
  it("the staged demo: lanes, barrier, order and capacity in words", () => {
    const s = load("kestrel-staged-three-lane.json");
    expect(stageSentence(s, 0)).toMatch(/^Stage 1: L1 behind barrier, traffic on L2-L3 — lanes L1 over the whole deck; L1 behind barrier round the clock until restored; operations: /);
    expect(stageSentence(s, 1)).toMatch(/L2, L3 behind barrier round the clock until restored;.* starts after stage 1 is finished \(\+24 h\); traffic capacity 2,600 veh\/h per direction\.$/);
  });
  it("an upgraded one-stage plan says it has no barrier between shifts; a stretch is given in stations", () => {
    const s = load("kestrel-two-season.json");
    expect(stageSentence(s, 0)).toContain("no barrier between shifts (short-term closures only)");
    const part = { ...s, stages: [{ ...s.stages[0], fromStationFt: s.deck.startStationFt + 250 }] };
    expect(stageSentence(part, 0)).toContain(`from STA ${Math.floor((s.deck.startStationFt + 250) / 100)}+50 to`);
  });
});
