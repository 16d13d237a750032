/**
 * Laws of stages and the closure timeline over generated scenarios (fast-check), all from MODEL.md "Stages",
 * "Closures that stand" and "Traffic"; plus worked checks of the long-term capacities and of a D/D/1 queue
 * under a standing closure with a short-term closure stacked on it.
 */
import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileScenario, simulate, type CompiledScenario } from "../../sim/engine";
import { impactModel, iterationImpact } from "../../sim/cost";
import { drawSamples } from "../../sim/samples";
import type { Scenario, ScenarioInput } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { compileTraffic, queueDelay } from "../../sim/traffic";
import { capacityOf, hcm2010LongTermPerLane, timelineCapacityPieces } from "../../sim/traffic-capacity";
import { runScenario } from "../../sim/index";
import { loadScenario, small } from "./engine-fixtures";

const q = (n: number) => n / 4;
const flat = (v: number) => new Array<number>(24).fill(v);

function tryParse(input: ScenarioInput): Scenario | null {
  const r = parseScenario(input);
  return r.ok ? r.scenario : null;
}

/** A three-lane deck in two stages with a night short-term closure, one traffic direction over all lanes. */
const stagedArb = fc.record({
  length: fc.integer({ min: 4, max: 10 }).map((n) => n * 100 - 40),
  split: fc.integer({ min: 1, max: 3 }).map((n) => n * 100),
  // Night windows that meet the 20:00 night shift, so the night pours can fit.
  winStart: fc.integer({ min: 18, max: 22 }),
  winLen: fc.integer({ min: 6, max: 10 }),
  setup: fc.integer({ min: 0, max: 6 }).map(q),
  takedown: fc.integer({ min: 0, max: 6 }).map(q),
  rates: fc.array(fc.constantFrom(40, 50, 100, 200), { minLength: 3, maxLength: 3 }),
  crews: fc.array(fc.integer({ min: 1, max: 2 }), { minLength: 3, maxLength: 3 }),
  cure: fc.integer({ min: 0, max: 40 }).map(q),
  when: fc.constantFrom("stageDone" as const, "restoredAhead" as const),
  lagFt: fc.constantFrom(0, 100, 200),
  override: fc.integer({ min: 600, max: 3000 }),
  demand: fc.array(fc.integer({ min: 0, max: 3600 }), { minLength: 24, maxLength: 24 }),
  twoSeason: fc.boolean(),
  start: fc.constantFrom("2027-04-05", "2027-10-04", "2027-11-15"),
});
type Staged = typeof stagedArb extends fc.Arbitrary<infer T> ? T : never;

function staged(g: Staged, edit: (s: ScenarioInput) => void = () => {}): ScenarioInput {
  return small((s) => {
    s.startDate = g.start;
    s.deck.lengthFt = g.length;
    s.deck.lanes = ["L1", "L2", "L3"];
    s.calendar.shifts = [
      { id: "day", name: "Day", startHour: 7, lengthHours: 10 },
      { id: "night", name: "Night", startHour: 20, lengthHours: 10 },
    ];
    s.calendar.workDays = [1, 2, 3, 4, 5];
    s.calendar.closures = [{ id: "night-l3", name: "Night L3", lanesClosed: ["L3"], setupHours: g.setup, takedownHours: g.takedown }];
    s.calendar.closureWindows = [{ closure: "night-l3", dayTypes: ["weekday", "sunday"], startHour: g.winStart, endHour: (g.winStart + g.winLen) % 24 }];
    s.calendar.season = g.twoSeason
      ? { plan: "two", winterStart: "12-01", winterEnd: "03-15", demobilizeHours: 4, remobilizeHours: 2, cutoffDate: g.start.startsWith("2027-11") ? "2027-11-26" : undefined }
      : { plan: "single", winterStart: "12-01", winterEnd: "03-15", demobilizeHours: 4, remobilizeHours: 2 };
    const rate = (v: number) => ({ unit: "ftPerHour" as const, dist: { type: "fixed" as const, value: v } });
    s.operations = [
      { id: "milling", name: "Milling", kind: "crew", crews: g.crews[0], shifts: ["day"], rate: rate(g.rates[0]), mobilizationHours: 1 },
      { id: "placement", name: "Placement", kind: "crew", crews: g.crews[1], shifts: ["night"], closure: "night-l3", rate: rate(g.rates[1]), continuous: true, mobilizationHours: 0.5 },
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: g.cure } },
      { id: "striping", name: "Striping", kind: "crew", crews: g.crews[2], shifts: ["day"], rate: rate(g.rates[2] * 2) },
    ];
    s.links = [
      { from: "milling", to: "placement", lagFt: 0, lagHours: 1 },
      { from: "placement", to: "cure", lagFt: 0, lagHours: 0 },
      { from: "cure", to: "striping", lagFt: 0, lagHours: 0 },
    ];
    s.stages = [
      { id: "s1", name: "Stage 1", lanes: ["L1"], standingLanesClosed: ["L1"] },
      { id: "s2", name: "Stage 2", lanes: ["L2"], standingLanesClosed: ["L2"], fromStationFt: s.deck.startStationFt + g.split, after: { stage: "s1", when: g.when, lagFt: g.lagFt, lagHours: 0 } },
    ];
    s.traffic = {
      directions: [{ id: "d", name: "D", lanes: ["L1", "L2", "L3"], heavyVehicleShare: 0, demand: { weekday: g.demand, friday: g.demand, saturday: g.demand, sunday: g.demand, holidayPeak: g.demand } }],
      closures: [{ closure: "night-l3", capacityVehPerHour: g.override }],
    };
    edit(s);
  });
}

function run(s: Scenario, k = 0): { c: CompiledScenario; delay: number; r: ReturnType<typeof simulate> } {
  const c = compileScenario(s);
  const r = simulate(c, drawSamples(s, "laws", k), { trace: true });
  const delay = iterationImpact(c, impactModel(c)!, r).delayVehHours;
  return { c, delay, r };
}

const settings = { numRuns: 40 };

/** Counts scenarios actually compared, so a generator whose scenarios are all rejected fails the test. */
function counter() {
  let runs = 0;
  let used = 0;
  return {
    tried: () => runs++,
    used: () => used++,
    check: () => expect(used).toBeGreaterThan(runs / 2),
  };
}

describe("laws of stages and the closure timeline", () => {
  it("adding a closed lane never lowers delay (and never changes the schedule)", () => {
    const n = counter();
    fc.assert(
      fc.property(stagedArb, fc.constantFrom("s1", "s2"), (g, which) => {
        const base = tryParse(staged(g));
        const more = tryParse(staged(g, (s) => {
          const st = s.stages!.find((x) => x.id === which)!;
          st.standingLanesClosed = ["L1", "L2"]; // one more lane behind barrier, L3 still open
        }));
        n.tried();
        if (!base || !more) return true;
        n.used();
        const a = run(base);
        const b = run(more);
        expect(b.r.finish).toBe(a.r.finish);
        expect(b.delay).toBeGreaterThanOrEqual(a.delay - 1e-6);
        expect(b.r.laneClosedHours).toBeGreaterThanOrEqual(a.r.laneClosedHours - 1e-9);
      }),
      settings,
    );
    n.check();
  });

  it("a longer set-up never finishes earlier (whole-hour windows and set-ups, so no new pour candidate appears)", () => {
    // MODEL.md: pour candidates are interval beginnings and whole hours. A set-up that is not a whole number of
    // hours would move an interval's beginning off the hour and create a candidate that did not exist: then a
    // pour may start earlier. With whole hours the usable time only shrinks, so nothing can finish earlier.
    const n = counter();
    fc.assert(
      fc.property(stagedArb, fc.integer({ min: 0, max: 2 }), fc.integer({ min: 1, max: 2 }), (g, u, more) => {
        const a = tryParse(staged({ ...g, setup: u, takedown: 0 }));
        const b = tryParse(staged({ ...g, setup: u + more, takedown: 0 }));
        n.tried();
        if (!a || !b) return true;
        n.used();
        expect(run(b).r.finish).toBeGreaterThanOrEqual(run(a).r.finish);
      }),
      settings,
    );
    n.check();
  });

  it("a stage's lanes are never open over deck that is milled but not yet restored", () => {
    const n = counter();
    fc.assert(
      fc.property(stagedArb, (g) => {
        const s = tryParse(staged(g));
        n.tried();
        if (!s) return true;
        n.used();
        const { c, r } = run(s);
        const tl = c.timeline;
        for (const st of c.stages) {
          const j = tl.closures.findIndex((x) => x.id === `stage:${st.id}`);
          const covered = (t: number) => {
            for (let k = 0; k < tl.periods.counts[j]; k++) if (t >= tl.periods.starts[j][k] && t < tl.periods.ends[j][k]) return true;
            return false;
          };
          for (let i = st.lo; i < st.hi; i++) {
            const mine = r.trace!.packets.filter((p) => p.stage === st.id && p.packet === i);
            const milled = Math.min(...mine.filter((p) => p.op === "milling").map((p) => p.mobilizedFrom ?? p.start));
            const restored = Math.max(...mine.map((p) => p.finish));
            if (!(restored < Infinity)) continue;
            // Every quarter hour between the first cut and the restoration, and both ends.
            for (let t = milled; t < restored; t = Math.min(restored - 1e-9, t + 0.25)) {
              if (!covered(t)) throw new Error(`${st.id} packet ${i}: lanes open at ${t} (milled ${milled}, restored ${restored})`);
              if (t === restored - 1e-9) break;
            }
          }
        }
      }),
      settings,
    );
    n.check();
  });

  it("lane-closed hours of a short-term closure ≥ its lanes × the hours some crew worked under it", () => {
    const n = counter();
    fc.assert(
      fc.property(stagedArb, (g) => {
        const s = tryParse(staged(g));
        n.tried();
        if (!s) return true;
        n.used();
        const { c, r } = run(s);
        const tr = r.trace!;
        // Production segments of the crews under "night-l3": [start, finish) minus the pauses inside.
        const segs: [number, number][] = [];
        for (const p of tr.packets.filter((x) => x.op === "placement")) {
          const pauses = tr.pauses.filter((x) => x.op === "placement" && x.stage === p.stage && x.packet === p.packet).sort((a, b) => a.start - b.start);
          let t = p.start;
          for (const x of pauses) {
            if (x.start > t) segs.push([t, x.start]);
            t = Math.max(t, x.end);
          }
          if (p.finish > t) segs.push([t, p.finish]);
        }
        segs.sort((a, b) => a[0] - b[0]);
        let union = 0;
        let end = -Infinity;
        for (const [a, b] of segs) {
          if (b <= end) continue;
          union += b - Math.max(a, end);
          end = b;
        }
        const j = c.timelineClosures.findIndex((x) => x.id === "night-l3");
        expect(r.laneClosedByClosure[j]).toBeGreaterThanOrEqual(1 * union - 1e-6);
      }),
      settings,
    );
    n.check();
  });

  it("one stage over all lanes: a standing closure changes the timeline, never the schedule", () => {
    const n = counter();
    fc.assert(
      fc.property(stagedArb, (g) => {
        const open = tryParse(staged(g, (s) => (s.stages = [{ id: "w", name: "W", lanes: ["L1", "L2"], standingLanesClosed: [] }])));
        const barrier = tryParse(staged(g, (s) => (s.stages = [{ id: "w", name: "W", lanes: ["L1", "L2"], standingLanesClosed: ["L1", "L2"] }])));
        n.tried();
        if (!open || !barrier) return true;
        n.used();
        const a = run(open);
        const b = run(barrier);
        expect(b.r.trace!.packets).toEqual(a.r.trace!.packets);
        expect(b.r.laneClosedHours).toBeGreaterThanOrEqual(a.r.laneClosedHours);
      }),
      settings,
    );
    n.check();
  });

  it("one stage over all lanes with no standing closure reproduces the single-pass engine's results", () => {
    // Golden values computed by the single-pass engine (no stages) with the hourly weather rules, commit
    // 6540506 on main (`npm run sim -- <file> --iterations 60 --seed single-pass --json`), on the same demos then
    // stored as version 1 (upgraded, they equal these files). The values recorded before the weather rules
    // (commit 40da1ef) no longer apply: the weather model changed, stages did not change it.
    // `delayNear`: the single-pass engine's median delay, which two later rules move by under 1 % with the
    // same finishes. (1) Holiday-work's median iteration has a 2 h weather pause of the night restriping crew
    // inside a closure window (21:00–23:00): the single-pass engine counted the lanes open during it; the
    // closure timeline keeps a short-term closure standing from first to last use in a window interval
    // (MODEL.md, "Closures that stand"). (2) A night shift that began in a holiday stand-down or a winter is no
    // longer worked after the block ends (MODEL.md, condition 3), so the closures of those nights' small hours
    // move to later nights (+0.05 to +0.7 % here).
    type Golden = { p50: string; p90: string } & ({ delayP50: null } | { delayNear: number });
    const golden: Record<string, Golden> = {
      "kestrel-two-season.json": { p50: "2028-09-29T20:29", p90: "2029-06-24T20:28", delayNear: 467058.6 },
      "kestrel-single-season.json": { p50: "2028-09-15T20:33", p90: "2029-06-03T20:33", delayNear: 452833 },
      "kestrel-two-placement-crews.json": { p50: "2028-07-07T20:57", p90: "2028-08-21T20:30", delayNear: 385541.2 },
      "kestrel-holiday-work.json": { p50: "2028-09-17T20:35", p90: "2029-06-11T20:28", delayNear: 490079.3 },
      "small-deterministic.json": { p50: "2027-04-07T09:00", p90: "2027-04-07T09:00", delayP50: null },
    };
    for (const [file, want] of Object.entries(golden)) {
      // The Kestrel demos' closure hours were later reworked with the closure-hours advisor; the golden values
      // belong to the demos as they were, kept in tests/fixtures/before-closure-advice/.
      const s = tryParse(file.startsWith("kestrel-") ? JSON.parse(readFileSync(new URL(`../fixtures/before-closure-advice/${file}`, import.meta.url), "utf8")) : loadScenario(file))!;
      expect(s.stages).toEqual([{ id: "whole-deck", name: "Whole deck", lanes: s.deck.lanes, standingLanesClosed: [] }]);
      const sum = runScenario(s, { iterations: 60, seed: "single-pass" });
      expect([file, sum.finishAt.p50, sum.finishAt.p90]).toEqual([file, want.p50, want.p90]);
      const delay = sum.delay?.vehicleHours.p50 ?? null;
      if ("delayP50" in want) expect([file, delay]).toEqual([file, want.delayP50]);
      else {
        expect(delay).not.toBeNull();
        expect([file, Math.abs(delay! - want.delayNear) / want.delayNear < 0.01]).toEqual([file, true]);
      }
    }
  }, 120_000);
});

describe("worked checks", () => {
  it("HCM 2010 long-term work-zone capacities: 3→2 and 3→1 1,450, 2→1 1,400 veh/h/ln", () => {
    // Source: HCM 2010 Exhibit 10-14 (long-term construction zones), found as reproduced in FHWA-HOP-13-042
    // Appendix D: 3→2 1,450; 3→1 1,450; 2→1 1,400 veh/h/ln. Other configurations are not in the table.
    expect(hcm2010LongTermPerLane(3, 2)).toBe(1450);
    expect(hcm2010LongTermPerLane(3, 1)).toBe(1450);
    expect(hcm2010LongTermPerLane(2, 1)).toBe(1400);
    expect(hcm2010LongTermPerLane(4, 2)).toBeNull();
  });

  it("D/D/1 by hand: a standing lane closure with a short-term closure stacked on it for an hour", () => {
    // Three lanes, no trucks. Standing closure of L1 from 0 to 10 h: 3→2 → HCM 2010 Exh. 10-14, 1,450 veh/h/ln
    // × 2 = 2,900 veh/h. A short-term closure of L2 stacked on it from 1 h to 2 h leaves one lane: Krammes &
    // Lopez (1994) (1,600 + I) · f_HV · n with I = 0, f_HV = 1, n = 1 → 1,600 veh/h. Demand 3,200 veh/h in
    // hours 0–2, then 2,000 veh/h (deterministic queuing, worked by hand):
    //   0–1 h: +300 veh/h → 300 veh, area ½·300·1 = 150;
    //   1–2 h: +1,600 veh/h → 1,900 veh, area (300 + 1,900)/2 · 1 = 1,100;
    //   then 2,900 − 2,000 = 900 veh/h of discharge: clears 1,900/900 = 2.111 h later, area ½·1,900·2.111 = 2,005.56.
    //   Delay = 150 + 1,100 + 2,005.56 = 3,255.56 veh-h.
    const demand = flat(2000);
    demand[0] = 3200;
    demand[1] = 3200;
    const s = tryParse(small((x) => {
      x.deck.lanes = ["L1", "L2", "L3"];
      x.calendar.closures = [
        { id: "one-lane", name: "One lane closed", lanesClosed: ["L1"] },
        { id: "l2", name: "L2", lanesClosed: ["L2"] },
      ];
      x.stages = [{ id: "st", name: "St", lanes: ["L1"], standingLanesClosed: ["L1"] }];
      x.traffic = {
        method: "krammesLopez", basePcPerHourPerLane: 1600,
        directions: [{ id: "d", name: "D", lanes: ["L1", "L2", "L3"], heavyVehicleShare: 0, demand: { weekday: demand, friday: flat(0), saturday: flat(0), sunday: flat(0), holidayPeak: flat(0) } }],
        closures: [],
      };
    }))!;
    const c = compileScenario(s);
    const m = compileTraffic(s, c.calendar.startDay, c.calendar.days)!;
    const dir = m.directions[0];
    expect(capacityOf(m, dir, 1 << 2)).toBe(2900); // standing alone (timeline closure 2 = stage "st")
    expect(capacityOf(m, dir, (1 << 2) | (1 << 1))).toBe(1600); // standing + L2
    // The timeline of this case, written into the compiled scenario's periods.
    const p = c.timeline.periods;
    p.counts.fill(0);
    p.starts[1][0] = 1;
    p.ends[1][0] = 2;
    p.counts[1] = 1;
    p.starts[2][0] = 0;
    p.ends[2][0] = 10;
    p.counts[2] = 1;
    expect(queueDelay(m, dir, timelineCapacityPieces(m, dir, c.timeline), null)).toBeCloseTo(150 + 1100 + 0.5 * 1900 * (1900 / 900), 6);
  });
});
