/**
 * Laws of the engine over generated small scenarios (fast-check), all from MODEL.md:
 * precedence, production only in open time that passes the gates, one crew per packet and one packet per
 * crew at a time, bit-for-bit determinism, monotonicity in crews and rates (deterministic mode, no
 * mobilization), and the lower bound of open time needed.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { accrueOpen, type Intervals } from "../../sim/calendar";
import { compileScenario, simulate, type SimResult } from "../../sim/engine";
import { drawSamples } from "../../sim/samples";
import type { CrewOperation, Scenario, ScenarioInput } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { hourlyTempF } from "../../sim/weather";
import { small } from "./engine-fixtures";

const q = (n: number) => n / 4; // quarter hours
const opArb = fc.record({
  crews: fc.integer({ min: 1, max: 3 }),
  rate: fc.constantFrom(20, 25, 40, 50, 100),
  continuous: fc.boolean(),
  gate: fc.constantFrom(undefined, 55, 62),
  mob: fc.constantFrom(0, 0, 2.5),
  lagFt: fc.constantFrom(0, 0, 50, 150),
  lagHours: fc.constantFrom(0, 0, 1.5),
});
const scenarioArb = fc.record({
  length: fc.integer({ min: 3, max: 8 }).map((n) => n * 100 - 30),
  shiftStart: fc.integer({ min: 0, max: 95 }).map(q),
  shiftLen: fc.integer({ min: 16, max: 48 }).map(q),
  winStart: fc.integer({ min: 0, max: 95 }).map(q),
  winEnd: fc.integer({ min: 0, max: 95 }).map(q),
  ops: fc.array(opArb, { minLength: 1, maxLength: 3 }),
});

type Generated = typeof scenarioArb extends fc.Arbitrary<infer T> ? T : never;
function build(g: Generated): ScenarioInput {
  return small((s) => {
    s.deck.lengthFt = g.length;
    s.calendar.shifts = [{ id: "s", name: "S", startHour: g.shiftStart, lengthHours: g.shiftLen }];
    s.calendar.closureWindows = [{ closure: "one-lane", dayTypes: ["weekday", "saturday"], startHour: g.winStart, endHour: g.winEnd }];
    s.calendar.workDays = [1, 2, 3, 4, 5, 6];
    s.operations = g.ops.map((o, i) => ({
      id: `op${i}`, name: `Op ${i}`, kind: "crew", crews: o.crews, shifts: ["s"], closure: "one-lane",
      rate: { unit: "ftPerHour", dist: { type: "fixed", value: o.rate } },
      continuous: o.continuous, mobilizationHours: o.mob, gates: o.gate ? { minTempF: o.gate } : {},
    }));
    s.links = g.ops.slice(1).map((o, i) => ({ from: `op${i}`, to: `op${i + 1}`, lagFt: o.lagFt, lagHours: o.lagHours }));
  });
}

function tryParse(input: ScenarioInput): Scenario | null {
  const r = parseScenario(input);
  return r.ok ? (r.scenario as Scenario) : null;
}

function openMeasure(iv: Intervals, a: number, b: number, slotOk: (k: number) => boolean): number {
  let sum = 0;
  for (let i = 0; i < iv.length; i++) {
    const s = Math.max(a, iv.starts[i]);
    const e = Math.min(b, iv.ends[i]);
    for (let t = s; t < e; ) {
      const next = Math.min(e, Math.floor(t) + 1);
      if (slotOk(Math.floor(t))) sum += next - t;
      t = next;
    }
  }
  return sum;
}

const settings = { numRuns: 60, seed: 20270405 };

describe("engine laws on generated scenarios", () => {
  it("respects precedence, open time, gates and crews", () => {
    fc.assert(
      fc.property(scenarioArb, (g) => {
        const s = tryParse(build(g));
        fc.pre(s !== null);
        const c = compileScenario(s!);
        const samples = drawSamples(s!, "law", 1);
        const res = simulate(c, samples, { trace: true });
        fc.pre(!res.unfinished);
        const tr = res.trace!.packets;
        const get = (op: string, i: number) => tr.find((p) => p.op === op && p.packet === i)!;
        s!.operations.forEach((op, oi) => {
          const o = op as CrewOperation;
          const iv = c.calendar.ops[oi]!.open;
          const ok = (k: number) =>
            !o.gates.minTempF || (hourlyTempF(samples.weather, k) >= o.gates.minTempF && hourlyTempF(samples.weather, k + 1) >= o.gates.minTempF);
          for (let i = 0; i < c.packets; i++) {
            const p = get(op.id, i);
            const hours = c.packetLen[i] / samples.rateFtPerHour[oi];
            // Precedence: start (of mobilization, if any) ≥ ready from the predecessor's finishes.
            for (const l of s!.links.filter((l) => l.to === op.id)) {
              const end = Math.min((i + 1) * s!.deck.packetFt, s!.deck.lengthFt);
              let ready = get(l.from, i).finish + l.lagHours;
              for (let k = 0; k < c.packets; k++)
                if (k * s!.deck.packetFt < end + l.lagFt) ready = Math.max(ready, get(l.from, k).finish);
              expect(p.mobilizedFrom ?? p.start).toBeGreaterThanOrEqual(ready - 1e-9);
            }
            // Production: exactly `hours` of open, gate-passing time between start and finish.
            expect(openMeasure(iv, p.start, p.finish, ok)).toBeCloseTo(hours, 6);
            if (o.continuous) {
              const j = Array.from(iv.starts).findIndex((st, j) => st <= p.start + 1e-9 && iv.ends[j] >= p.finish - 1e-9);
              expect(j, `${op.id}[${i}] inside one open interval`).toBeGreaterThanOrEqual(0);
              expect(p.finish - p.start).toBeCloseTo(hours, 9);
            }
          }
          // One packet at a time per crew, in claim order.
          for (let k = 0; k < o.crews; k++) {
            const mine = tr.filter((p) => p.op === op.id && p.crew === k).sort((a, b) => a.packet - b.packet);
            for (let j = 1; j < mine.length; j++) expect(mine[j].mobilizedFrom ?? mine[j].start).toBeGreaterThanOrEqual(mine[j - 1].finish - 1e-9);
          }
          // Every packet claimed exactly once.
          expect(tr.filter((p) => p.op === op.id).map((p) => p.packet).sort((a, b) => a - b)).toEqual([...Array(c.packets).keys()]);
          // Lower bound: the open time one crew would need for its share of all packets.
          const total = Array.from(c.packetLen).reduce((a, b) => a + b, 0) / samples.rateFtPerHour[oi];
          expect(res.opFinish[oi]).toBeGreaterThanOrEqual(accrueOpen(iv, 0, total / o.crews) - 1e-9);
        });
      }),
      settings,
    );
  });

  it("is deterministic bit for bit for a seed", () => {
    fc.assert(
      fc.property(scenarioArb, fc.integer({ min: 0, max: 1000 }), (g, k) => {
        const s = tryParse(build(g));
        fc.pre(s !== null);
        const a = simulate(compileScenario(s!), drawSamples(s!, "det", k), { trace: true });
        const b = simulate(compileScenario(s!), drawSamples(s!, "det", k), { trace: true });
        expect(strip(a)).toEqual(strip(b));
      }),
      { ...settings, numRuns: 25 },
    );
  });

  it("never finishes later with one more crew or a faster rate (deterministic, no mobilization)", () => {
    fc.assert(
      fc.property(scenarioArb, fc.nat(), fc.boolean(), (g, pick, crews) => {
        g.ops.forEach((o) => (o.mob = 0));
        const s = tryParse(build(g));
        fc.pre(s !== null);
        const base = simulate(compileScenario(s!), drawSamples(s!, "m", 0));
        const better = structuredClone(s!);
        const op = better.operations[pick % better.operations.length] as CrewOperation;
        if (crews) op.crews += 1;
        else op.rate.dist = { type: "fixed", value: (op.rate.dist as { value: number }).value * 1.5 };
        const faster = simulate(compileScenario(better), drawSamples(better, "m", 0));
        expect(faster.finish).toBeLessThanOrEqual(base.finish + 1e-9);
      }),
      settings,
    );
  });
});

function strip(r: SimResult) {
  return { ...r, laneClosedByClosure: Array.from(r.laneClosedByClosure), stageFinish: Array.from(r.stageFinish), opFinish: Array.from(r.opFinish) };
}
