/**
 * The hour-stepped reference simulator (tests/oracle/reference-sim.ts) checked two ways:
 * (a) against finishes worked out by hand from MODEL.md (this file's first block), and
 * (b) against the event engine (sim/index.ts) on deterministic, seeded and generated scenarios.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compileScenario, drawSamples, parseScenario, simulate, type Scenario } from "../../sim/index";
import type { IterationSamples } from "../../sim/samples";
import { scenarioSchema } from "../../sim/schema";
import { lanesClosedAt, referenceSimulate, type RefResult } from "../oracle/reference-sim";
import {
  at, baseInput, climate, crewOp, deterministicCases, fixedSamples, scenario, stagedCases, stochasticInput, type Input,
} from "../oracle/fixtures";
import type { CompiledScenario } from "../../sim/engine";

const DT = 0.25;
const byKey = (r: RefResult) => new Map(r.packets.map((p) => [`${p.op}#${p.packet}`, p]));

describe("reference simulator, hand-worked cases (MODEL.md applied by hand)", () => {
  it("1,000 ft, milling then cleanup, one day window: finishes Wednesday 15:00", () => {
    // Open time = shift 07–17 ∩ window 08–16 = 08:00–16:00 Mon–Fri (8 h). 10 packets of 100 ft.
    // Milling 50 ft/h → 2 h a packet, 2 h mobilization from 08:00 Monday (t = 0 is Monday 00:00):
    //   Mon: mob 08–10, p0 10–12, p1 12–14, p2 14–16; Tue: p3–p6 08–16 (p6 ends 40 h);
    //   Wed: p7 56–58, p8 58–60, p9 60–62.
    // Cleanup 100 ft/h → 1 h, ready at milling's finish of the same packet:
    //   p0 12–13, p1 14–15, p2 ready 16:00 (closed) → Tue 08–09 (32–33), p3 34–35, p4 36–37, p5 38–39,
    //   p6 ready 40 (Tue 16:00, closed) → Wed 56–57, p7 58–59, p8 60–61, p9 62–63 → finish 63 h = Wed 15:00.
    const s = scenario((x) => {
      x.operations = [crewOp("milling", 50, { mobilizationHours: 2 }), crewOp("cleanup", 100)];
      x.links = [{ from: "milling", to: "cleanup" }];
    });
    const r = referenceSimulate(s, fixedSamples(s), DT);
    const k = byKey(r);
    expect(r.unfinished).toBe(false);
    expect(r.finish).toBeCloseTo(63, 9);
    expect(k.get("milling#0")).toMatchObject({ start: 10, finish: 12 });
    expect(k.get("milling#9")).toMatchObject({ start: 60, finish: 62 });
    expect(k.get("cleanup#2")).toMatchObject({ start: 32, finish: 33 });
    expect(k.get("cleanup#6")).toMatchObject({ start: 56, finish: 57 });
    expect(r.packets).toHaveLength(20);
  });

  it("night shift of Friday runs into Saturday; the weekend is skipped", () => {
    // Night shift 20:00 + 10 h on Mon–Fri ∩ overnight window 21:00–05:00 → open 21:00–05:00 after each
    // work day, including Fri 21:00 → Sat 05:00 (the shift belongs to Friday, the window to a weekday).
    // 25 ft/h → 4 h a packet, 2 a night; 11 packets: nights Mon–Fri take p0–p9 (p9 ends Sat 05:00 = 125 h);
    // Sat/Sun shifts are not on work days, so p10 waits for Mon 21:00 (7·24 + 21 = 189) → 193 h.
    const s = scenario((x) => {
      x.deck.lengthFt = 1100;
      x.operations = [crewOp("night-mill", 25, { shifts: ["night"], closure: "two-lane" })];
    });
    const k = byKey(referenceSimulate(s, fixedSamples(s), DT));
    expect(k.get("night-mill#0")).toMatchObject({ start: 21, finish: 25 });
    expect(k.get("night-mill#9")).toMatchObject({ start: 121, finish: 125 });
    expect(k.get("night-mill#10")).toMatchObject({ start: 189, finish: 193 });
  });

  it("Independence Day 2027 stand-down: blocked from Friday 15:00 to Monday 24:00", () => {
    // 4 July 2027 is a Sunday, observed Monday 5 July (5 U.S.C. 6103); the block Sat 3–Mon 5 runs from
    // Fri 2 July 15:00 to Mon 5 July 24:00. Start Thu 1 July, 50 ft/h → 2 h a packet, open 08–16:
    //   Thu: p0–p3; Fri: p4 32–34, p5 34–36, p6 36–38, p7 starts 38 (14:00), 1 h done by 15:00;
    //   Tue 6 July (t = 120 at 00:00): p7 resumes 128–129, p8 129–131, p9 131–133.
    const s = scenario((x) => {
      x.startDate = "2027-07-01";
      x.calendar.holidays.policy = "standDown";
      x.operations = [crewOp("milling", 50)];
    });
    const r = referenceSimulate(s, fixedSamples(s), DT);
    const k = byKey(r);
    expect(k.get("milling#7")).toMatchObject({ start: 38, finish: 129 });
    expect(r.finish).toBeCloseTo(133, 9);
  });

  it("winter with demobilization and remobilization", () => {
    // Start Mon 29 Nov 2027, winter 1 Dec → 1 Mar, demobilize 12 h (blocked from Tue 30 Nov 12:00),
    // remobilize 3 h. 25 ft/h → 4 h a packet, open 08–16, no holidays observed.
    //   Mon: p0 08–12, p1 12–16; Tue: p2 08–12, then blocked. Wed 1 Mar 2028: remob 08–11, p3 11–15,
    //   p4 15–16 + Thu 08–11, p5 11–15, p6 15–16 + Fri 08–11, p7 11–15, p8 15–16 + Mon 6 Mar 08–11,
    //   p9 11–15.
    const s = scenario((x) => {
      x.startDate = "2027-11-29";
      x.calendar.holidays.observeFederal = false;
      x.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-01", demobilizeHours: 12, remobilizeHours: 3 };
      x.operations = [crewOp("milling", 25)];
    });
    const k = byKey(referenceSimulate(s, fixedSamples(s), DT));
    expect(k.get("milling#2")).toMatchObject({ start: 32, finish: 36 });
    expect(k.get("milling#3")).toMatchObject({ start: at(s, "2028-03-01", 11), finish: at(s, "2028-03-01", 15) });
    expect(k.get("milling#4")).toMatchObject({ start: at(s, "2028-03-01", 15), finish: at(s, "2028-03-02", 11) });
    expect(k.get("milling#9")).toMatchObject({ start: at(s, "2028-03-06", 11), finish: at(s, "2028-03-06", 15) });
  });

  it("two-season cut-off station: packets at or past it wait for the end of the first winter", () => {
    // Plan two, cut-off STA 15+00 on a deck from STA 10+00 → offset 500 ft: p5–p9 not before 1 Mar 2028.
    // Start Mon 15 Nov 2027, winter 15 Dec → 1 Mar, remobilize 2 h. 25 ft/h → 4 h, open 08–16:
    //   Mon p0, p1; Tue p2, p3; Wed p4 08–12. Wed 1 Mar 2028: remob 08–10, p5 10–14, p6 14–16 + Thu 08–10,
    //   p7 10–14, p8 14–16 + Fri 08–10, p9 10–14.
    const s = scenario((x) => {
      x.startDate = "2027-11-15";
      x.calendar.holidays.observeFederal = false;
      x.calendar.season = {
        plan: "two", winterStart: "12-15", winterEnd: "03-01", demobilizeHours: 0, remobilizeHours: 2, cutoffStationFt: 1500,
      };
      x.operations = [crewOp("milling", 25)];
    });
    const k = byKey(referenceSimulate(s, fixedSamples(s), DT));
    expect(k.get("milling#4")).toMatchObject({ start: 56, finish: 60 });
    expect(k.get("milling#5")).toMatchObject({ start: at(s, "2028-03-01", 10), finish: at(s, "2028-03-01", 14) });
    expect(k.get("milling#9")).toMatchObject({ start: at(s, "2028-03-03", 10), finish: at(s, "2028-03-03", 14) });
  });

  it("continuous pour must fit one open interval and keep 3 rain-free hours after it", () => {
    // Shift 06:00 + 18 h ∩ window 06–24 → open 06:00–24:00 weekdays; 25 ft/h → 4 h pours; rain all of
    // Wed 9 June. Mon: p0–p3 06–22 (22–24 too short). Tue: p4–p6 06–18; p7 at 18 would end 22 and need
    // 22–01 dry (rain from 00:00 Wed), 19 and 20 fail likewise, 21 does not fit before 24. Wed rains.
    // Thu (t = 72): p7 78–82, p8 82–86, p9 86–90.
    const s = scenario((x) => {
      x.calendar.shifts.push({ id: "long", name: "Long", startHour: 6, lengthHours: 18 });
      x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["weekday"], startHour: 6, endHour: 24 });
      x.calendar.closures.push({ id: "pour", name: "Pour", lanesClosed: ["L2"] });
      x.calendar.closureWindows.push({ closure: "pour", dayTypes: ["weekday"], startHour: 6, endHour: 24 });
      x.weather.fixedWetDates = ["2027-06-09"];
      x.operations = [
        crewOp("placement", 25, { shifts: ["long"], closure: "pour", continuous: true, gates: { noRain: true, noRainHoursAfter: 3 } }),
      ];
    });
    const k = byKey(referenceSimulate(s, fixedSamples(s), DT));
    expect(k.get("placement#3")).toMatchObject({ start: 18, finish: 22 });
    expect(k.get("placement#6")).toMatchObject({ start: 38, finish: 42 });
    expect(k.get("placement#7")).toMatchObject({ start: 78, finish: 82 });
    expect(k.get("placement#9")).toMatchObject({ start: 86, finish: 90 });
  });

  it("back-to-back shifts are one open interval: a pour ready at 12:15 starts at 13:00, not 12:30", () => {
    // MODEL.md: candidates are beginnings of open intervals and whole hours; 07:00–12:30 and 12:30–16:30
    // shifts inside the 08–16 window leave one interval 08–16, so 12:30 is not a beginning. 2 h pours:
    // p0 13–15; p1 would end 17 → next day 08–10 (32–34), p2 34–36.
    const c = deterministicCases.find((x) => x.name.startsWith("back-to-back"))!;
    const s = scenarioSchema.parse(c.input);
    const k = byKey(referenceSimulate(s, fixedSamples(s), DT));
    expect(k.get("placement#0")).toMatchObject({ start: 13, finish: 15 });
    expect(k.get("placement#2")).toMatchObject({ start: 34, finish: 36 });
  });

  it("a 45 °F gate blocks cold mornings", () => {
    // Fixed climate tmin 38 °F, tmax 60 °F. MODEL.md's half-cosine rise from 06:00 to 15:00:
    // T(h) = 38 + 22·(1 − cos(π(h − 6)/9))/2 → T(9) = 43.5, T(10) = 47.1; so slot 9 fails, 10–14 pass, and
    // the fall after 15:00 is slow (T(16) ≈ 59.8), so slot 15 passes: production 10:00–16:00, 6 h a day.
    // 50 ft/h → 2 h: 3 packets a day Mon–Wed, p9 Thu 10–12 → 3·24 + 12 = 84 h.
    const s = scenario((x) => {
      x.weather.monthly = climate({ tminF: 38, tmaxF: 60 });
      x.operations = [crewOp("milling", 50, { gates: { minTempF: 45 } })];
    });
    const r = referenceSimulate(s, fixedSamples(s), DT);
    expect(byKey(r).get("milling#0")).toMatchObject({ start: 10, finish: 12 });
    expect(r.finish).toBeCloseTo(84, 9);
  });
});

// ---------------------------------------------------------------------------------------------------------
// Reference vs engine.

function parsed(input: unknown): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(`scenario rejected: ${r.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  return r.scenario;
}

interface EnginePacket { op: string; stage?: string; packet: number; crew: number; start: number; finish: number }

/**
 * Every packet the reference finished by `untilHours` must match the engine's (op, packet, crew, start,
 * finish) within `tol`, and the engine may not have finished a packet by then that the reference did not.
 * Returns readable disagreements (empty = agreement).
 */
function disagreements(s: Scenario, ref: RefResult, engPackets: EnginePacket[], tol: number, untilHours: number): string[] {
  const crewOp = new Set(s.operations.filter((o) => o.kind === "crew").map((o) => o.id));
  const eng = new Map(engPackets.map((p) => [`${p.stage}/${p.op}#${p.packet}`, p]));
  const refKeys = new Set<string>();
  const out: string[] = [];
  for (const r of ref.packets) {
    if (r.finish > untilHours) continue;
    const key = `${r.stage}/${r.op}#${r.packet}`;
    refKeys.add(key);
    const e = eng.get(key);
    if (!e) {
      out.push(`${key}: reference ${r.start}→${r.finish}, engine has no such packet`);
      continue;
    }
    const bad =
      Math.abs(e.start - r.start) > tol || Math.abs(e.finish - r.finish) > tol || (crewOp.has(r.op) && e.crew !== r.crew);
    if (bad) out.push(`${key}: reference crew ${r.crew} ${r.start}→${r.finish}, engine crew ${e.crew} ${e.start}→${e.finish}`);
  }
  for (const e of engPackets)
    if (e.finish <= untilHours - tol && !refKeys.has(`${e.stage}/${e.op}#${e.packet}`))
      out.push(`${e.op}#${e.packet}: engine ${e.start}→${e.finish}, reference did not finish it by ${untilHours} h`);
  return out;
}

function runEngine(s: Scenario, samples: IterationSamples) {
  const c = compileScenario(s);
  const r = simulate(c, samples, { trace: true });
  return { finish: r.finish, unfinished: r.unfinished, packets: r.trace!.packets as EnginePacket[], compiled: c, result: r };
}

/** Lanes closed at t in the engine's timeline (the periods `simulate` just built on `c`). */
function engineLanesAt(c: CompiledScenario, t: number): string {
  const tl = c.timeline;
  const out = new Set<string>();
  tl.closures.forEach((cl, j) => {
    for (let k = 0; k < tl.periods.counts[j]; k++) if (t >= tl.periods.starts[j][k] && t < tl.periods.ends[j][k]) cl.lanes.forEach((l) => out.add(l));
  });
  return [...out].sort().join(",");
}

/** Step midpoints (quarter hours) up to `until` where the two timelines close different lanes. */
function timelineDisagreements(c: CompiledScenario, ref: RefResult, until: number): string[] {
  const out: string[] = [];
  for (let t = DT / 2; t < until; t += DT) {
    const a = lanesClosedAt(ref, t).join(",");
    const b = engineLanesAt(c, t);
    if (a !== b) out.push(`t = ${t}: reference closes [${a}], engine [${b}]`);
    if (out.length >= 4) break;
  }
  return out;
}

/** ∫ |lanes closed| dt of the reference timeline, step by step (exact when every boundary is on a quarter hour). */
function referenceLaneHours(ref: RefResult, until: number): number {
  let h = 0;
  for (let t = DT / 2; t < until; t += DT) h += lanesClosedAt(ref, t).length * DT;
  return h;
}

describe("reference vs engine, deterministic scenarios (exact on quarter hours)", () => {
  for (const c of deterministicCases) {
    it(c.name, () => {
      const s = parsed(c.input);
      // Samples built from MODEL.md in fixtures (not drawSamples); one object per simulator, as the weather
      // series grows lazily while it is read.
      const ref = referenceSimulate(s, fixedSamples(s), DT, 400);
      const eng = runEngine(s, fixedSamples(s));
      expect(ref.unfinished).toBe(false);
      expect(eng.unfinished).toBe(false);
      expect(eng.packets).toHaveLength(ref.packets.length);
      expect(disagreements(s, ref, eng.packets, 1e-6, Infinity)).toEqual([]);
      expect(eng.finish).toBeCloseTo(ref.finish, 6);
      // The engine's drawSamples must give the same fixed rates (ftPerShift ÷ first listed shift) and waits.
      const drawn = drawSamples(s, "any", 0);
      const mine = fixedSamples(s);
      expect(Array.from(drawn.rateFtPerHour)).toEqual(Array.from(mine.rateFtPerHour));
      expect(Array.from(drawn.waitHours)).toEqual(Array.from(mine.waitHours));
    });
  }
});

describe("reference vs engine, staged scenarios: every packet and the closure timeline hour by hour", () => {
  for (const c of stagedCases) {
    it(c.name, () => {
      const s = parsed(c.input);
      const ref = referenceSimulate(s, fixedSamples(s), DT, 400);
      const eng = runEngine(s, fixedSamples(s));
      expect(ref.unfinished).toBe(false);
      expect(eng.unfinished).toBe(false);
      expect(eng.packets).toHaveLength(ref.packets.length);
      expect(disagreements(s, ref, eng.packets, 1e-6, Infinity)).toEqual([]);
      expect(eng.finish).toBeCloseTo(ref.finish, 6);
      for (const st of eng.compiled.stages) expect(eng.result.stageFinish[st.index]).toBeCloseTo(ref.stageFinish[st.id], 6);
      const until = ref.finish + 48;
      expect(timelineDisagreements(eng.compiled, ref, until)).toEqual([]);
      expect(eng.result.laneClosedHours).toBeCloseTo(referenceLaneHours(ref, until), 6);
    });
  }

  it("hand-worked: set-up 1 h and take-down 0.5 h around Monday's use of the 08–16 window", () => {
    // MODEL.md "Closures that stand": window interval 08:00–16:00, usable 09:00–15:30. Milling (shift 07–17,
    // 50 ft/h → 2 h a packet) mobilizes 09–11, p0 11–13, p1 13–15, p2 15:00–15:30 then Tuesday 09:00–10:30.
    // Monday's period: first use 09:00 − 1 h = 08:00 to last use 15:30 + 0.5 h = 16:00, one lane (L1).
    const s = parsed(stagedCases.find((x) => x.name.startsWith("short-term closure"))!.input);
    const ref = referenceSimulate(s, fixedSamples(s), DT, 60);
    const key = new Map(ref.packets.map((p) => [`${p.op}#${p.packet}`, p]));
    expect(key.get("milling#0")).toMatchObject({ start: 11, finish: 13 });
    expect(key.get("milling#2")).toMatchObject({ start: 15, finish: 24 + 10.5 });
    expect(ref.periods.filter((p) => p.closure === "one-lane" && p.start < 24)).toEqual([
      { closure: "one-lane", kind: "short", lanes: ["L1"], start: 8, end: 16 },
    ]);
    const eng = runEngine(s, fixedSamples(s));
    const j = eng.compiled.timelineClosures.findIndex((c) => c.id === "one-lane");
    expect([eng.compiled.timeline.periods.starts[j][0], eng.compiled.timeline.periods.ends[j][0]]).toEqual([8, 16]);
  });

  it("two-season plans: the barrier is lifted over the first winter only when every started packet is restored", () => {
    const lifted = parsed(stagedCases.find((x) => x.name.startsWith("two-season plan restores"))!.input);
    const kept = parsed(stagedCases.find((x) => x.name.startsWith("two-season plan whose"))!.input);
    const a = referenceSimulate(lifted, fixedSamples(lifted), DT, 400);
    const b = referenceSimulate(kept, fixedSamples(kept), DT, 400);
    // Lifted: two standing periods, the first ending at the cut-off date 2027-11-08 00:00 (168 h).
    const standingA = a.periods.filter((p) => p.kind === "standing");
    expect(standingA).toHaveLength(2);
    expect(standingA[0].end).toBe(at(lifted, "2027-11-08"));
    expect(standingA[1].start).toBeGreaterThanOrEqual(at(lifted, "2028-03-15"));
    expect(runEngine(lifted, fixedSamples(lifted)).result.winterStanding).toBe(false);
    // Kept: milling at 10 ft/h leaves a packet half done at the cut-off, so one period spans the winter.
    expect(b.periods.filter((p) => p.kind === "standing")).toHaveLength(1);
    expect(runEngine(kept, fixedSamples(kept)).result.winterStanding).toBe(true);
  });
});

describe("reference vs engine, seeded stochastic scenarios", () => {
  // 2,000 ft, five operations, stochastic weather, triangular/PERT/lognormal rates, discovered conditions.
  // drawSamples is called twice with the same (seed, iteration), once for each simulator, so neither sees
  // weather days the other generated (and the call is checked to be a pure function on the way).
  // Tolerance one step dt: the reference decides "open", the hour slot and the continuous-pour candidates
  // once per step, so a boundary off the dt grid could move a time by up to one step. Here every calendar
  // boundary is on a quarter hour and gates change on whole hours, so agreement is in fact much closer.
  const starts = ["2027-04-05", "2027-05-17", "2027-11-08"]; // spring rain, Memorial Day, cold + Thanksgiving + winter
  for (let k = 0; k < 20; k++) {
    it(`seed oracle:${k} from ${starts[k % 3]}`, () => {
      const input = stochasticInput();
      input.startDate = starts[k % 3];
      const s = parsed(input);
      const ref = referenceSimulate(s, drawSamples(s, "oracle", k), DT, 800);
      const eng = runEngine(s, drawSamples(s, "oracle", k));
      expect(ref.unfinished).toBe(false);
      expect(eng.unfinished).toBe(false);
      expect(eng.packets).toHaveLength(ref.packets.length);
      expect(disagreements(s, ref, eng.packets, DT, Infinity)).toEqual([]);
      expect(Math.abs(eng.finish - ref.finish)).toBeLessThanOrEqual(DT);
    });
  }
});

describe("reference vs engine, generated small scenarios (fast-check)", () => {
  const quarter = (lo: number, hi: number) => fc.integer({ min: lo * 4, max: hi * 4 }).map((q) => q / 4);
  const DAY_TYPES = ["weekday", "saturday", "sunday", "holiday"] as const;

  const arbInput = fc
    .record({
      startDay: fc.integer({ min: 0, max: 200 }), // days after 2027-04-01: some runs meet holidays and winter
      lengthFt: fc.integer({ min: 4, max: 24 }).map((n) => n * 25),
      packetFt: fc.constantFrom(100, 150, 200),
      shifts: fc.array(fc.record({ startHour: quarter(0, 23.75), lengthHours: quarter(3, 14) }), { minLength: 1, maxLength: 2 }),
      workDays: fc.subarray([0, 1, 2, 3, 4, 5, 6], { minLength: 2 }),
      // Windows as (start, length): the end wraps past midnight, which exercises overnight windows.
      windows: fc.array(
        fc.record({
          closure: fc.constantFrom("one-lane", "two-lane"),
          dayTypes: fc.subarray([...DAY_TYPES], { minLength: 2 }),
          startHour: quarter(0, 23.75),
          lengthHours: quarter(3, 20),
        }),
        { minLength: 2, maxLength: 4 },
      ),
      policy: fc.constantFrom("standDown" as const, "workThrough" as const),
      standDownStartHour: quarter(0, 24),
      throughMonday: fc.boolean(),
      // A warm month next to a cool one: nights that rise at the month's turn, cold protection windows.
      warmMonth: fc.option(fc.integer({ min: 3, max: 8 }), { nil: undefined }),
      blackouts: fc.array(fc.integer({ min: 0, max: 60 }), { maxLength: 2 }), // days after the start
      wetDays: fc.array(fc.integer({ min: 0, max: 60 }), { maxLength: 3 }),
      twoSeason: fc.option(fc.record({ cutoffDay: fc.integer({ min: 10, max: 90 }), cutoffFt: fc.integer({ min: 0, max: 24 }).map((n) => n * 25) }), { nil: undefined }),
      demob: quarter(0, 8),
      remob: quarter(0, 4),
      // Closure set-up and take-down, and an optional second stage over part of the deck (MODEL.md "Stages").
      setup: fc.array(quarter(0, 1.5), { minLength: 2, maxLength: 2 }),
      takedown: fc.array(quarter(0, 1.5), { minLength: 2, maxLength: 2 }),
      stage2: fc.option(
        fc.record({
          fromFt: fc.integer({ min: 0, max: 20 }).map((n) => n * 25),
          when: fc.constantFrom("stageDone" as const, "restoredAhead" as const),
          lagFt: fc.integer({ min: 0, max: 4 }).map((n) => n * 50),
          lagHours: quarter(0, 6),
          standing1: fc.boolean(),
          standing2: fc.boolean(),
          dropFirstOp: fc.boolean(),
        }),
        { nil: undefined },
      ),
      ops: fc.array(
        fc.record({
          wait: fc.integer({ min: 0, max: 4 }).map((n) => n === 0), // about one operation in five
          waitHours: quarter(0.25, 36),
          crews: fc.integer({ min: 1, max: 3 }),
          rate: fc.integer({ min: 10, max: 200 }),
          perShift: fc.boolean(),
          shiftMask: fc.integer({ min: 1, max: 3 }),
          closure: fc.constantFrom("one-lane", "two-lane"),
          mob: quarter(0, 4),
          continuous: fc.integer({ min: 0, max: 2 }).map((n) => n === 0),
          minTempF: fc.option(fc.integer({ min: 55, max: 75 }), { nil: undefined }),
          rising: fc.integer({ min: 0, max: 3 }).map((n) => n === 0),
          maxTempF: fc.option(fc.integer({ min: 70, max: 90 }), { nil: undefined }),
          protectAfter: fc.option(fc.record({ minTempF: fc.integer({ min: 45, max: 70 }), hours: quarter(0, 16) }), { nil: undefined }),
          countAboveF: fc.option(fc.integer({ min: 50, max: 75 }), { nil: undefined }),
          noRain: fc.boolean(),
          noRainHoursAfter: quarter(0, 4),
          lagFt: fc.integer({ min: 0, max: 4 }).map((n) => n * 25),
          lagHours: quarter(0, 6),
        }),
        { minLength: 1, maxLength: 4 },
      ),
    })
    .map((g): Input => {
      const x = baseInput();
      const iso = (day: number) => new Date(Date.UTC(2027, 3, 1 + day)).toISOString().slice(0, 10);
      x.startDate = iso(g.startDay);
      x.deck.lengthFt = g.lengthFt;
      x.deck.packetFt = g.packetFt;
      x.calendar.shifts = g.shifts.map((s, i) => ({ id: `s${i}`, name: `Shift ${i}`, ...s }));
      x.calendar.workDays = g.workDays;
      x.calendar.closureWindows = g.windows.map((w) => ({
        closure: w.closure,
        dayTypes: [...w.dayTypes],
        startHour: w.startHour,
        endHour: (w.startHour + w.lengthHours) % 24,
      }));
      const withWindows = [...new Set(g.windows.map((w) => w.closure))];
      x.calendar.holidays = {
        policy: g.policy, observeFederal: true, blackoutDates: g.blackouts.map((d) => iso(g.startDay + d)),
        standDownStartHour: g.standDownStartHour, standDownThroughMonday: g.throughMonday,
      };
      x.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-01", demobilizeHours: g.demob, remobilizeHours: g.remob };
      if (g.twoSeason)
        x.calendar.season = {
          ...x.calendar.season,
          plan: "two",
          cutoffDate: iso(g.startDay + g.twoSeason.cutoffDay),
          cutoffStationFt: x.deck.startStationFt + Math.min(g.twoSeason.cutoffFt, g.lengthFt),
        };
      const monthly = climate({ tminF: 50, tmaxF: 80 }).map((m, i) => (i === g.warmMonth ? { ...m, tminMeanF: 82, tmaxMeanF: 95 } : m));
      x.weather = { mode: "fixed", monthly, fixedWetDates: g.wetDays.map((d) => iso(g.startDay + d)) };
      x.operations = g.ops.map((o, i) =>
        o.wait
          ? { id: `op${i}`, name: `Op ${i}`, kind: "wait" as const, durationHours: { type: "fixed" as const, value: o.waitHours }, countAboveF: o.countAboveF }
          : {
              ...crewOp(`op${i}`, o.rate, {
                crews: o.crews,
                shifts: g.shifts.length === 1 ? ["s0"] : ["s0", "s1"].filter((_, j) => o.shiftMask & (1 << j)),
                closure: withWindows.includes(o.closure) ? o.closure : withWindows[0],
                mobilizationHours: o.mob,
                continuous: o.continuous,
                gates: {
                  minTempF: o.minTempF, maxTempF: o.maxTempF === undefined ? undefined : Math.max(o.maxTempF, o.minTempF ?? 0),
                  rising: o.rising, noRain: o.noRain, noRainHoursAfter: o.noRainHoursAfter, protectAfter: o.protectAfter,
                },
              }),
              rate: { unit: o.perShift ? ("ftPerShift" as const) : ("ftPerHour" as const), dist: { type: "fixed" as const, value: o.rate * (o.perShift ? 8 : 1) } },
            },
      );
      x.links = g.ops.slice(1).map((o, i) => ({ from: `op${i}`, to: `op${i + 1}`, lagFt: o.lagFt, lagHours: o.lagHours }));
      x.calendar.closures = x.calendar.closures.map((c, i) => ({ ...c, setupHours: g.setup[i], takedownHours: g.takedown[i] }));
      const st = g.stage2;
      if (st) {
        const ids = x.operations.map((o) => o.id);
        x.stages = [
          { id: "s1", name: "Stage 1", lanes: ["L1"], standingLanesClosed: st.standing1 ? ["L1"] : [] },
          {
            // A packet boundary inside the deck, so the stage always holds a packet.
            id: "s2", name: "Stage 2", lanes: ["L2"],
            fromStationFt: x.deck.startStationFt + Math.min(st.fromFt / 25, Math.ceil(g.lengthFt / g.packetFt) - 1) * g.packetFt,
            standingLanesClosed: st.standing2 ? ["L2"] : [],
            operations: st.dropFirstOp && ids.length > 1 ? ids.slice(1) : ids,
            after: { stage: "s1", when: st.when, lagFt: st.lagFt, lagHours: st.lagHours },
          },
        ];
      }
      return x;
    });

  it("engine and reference agree on every packet the reference finishes within 120 days", () => {
    const HORIZON = 120;
    let compared = 0;
    let runs = 0;
    const rejected = new Map<string, number>();
    fc.assert(
      fc.property(arbInput, (input) => {
        runs++;
        const p = parseScenario(input);
        if (!p.ok) {
          for (const q of p.problems) rejected.set(q.message, (rejected.get(q.message) ?? 0) + 1);
          return true; // the engine's validator rejects it (e.g. windows never meet shifts): nothing to compare
        }
        const s = p.scenario;
        const ref = referenceSimulate(s, fixedSamples(s), DT, HORIZON);
        const eng = runEngine(s, fixedSamples(s));
        compared++;
        const bad = disagreements(s, ref, eng.packets, 1e-6, HORIZON * 24);
        // The closure timeline hour by hour, when the reference finished inside its horizon (so that both know
        // every restoration); short-term periods and standing closures alike.
        if (!ref.unfinished) bad.push(...timelineDisagreements(eng.compiled, ref, ref.finish + 48));
        if (bad.length) throw new Error(`${bad.slice(0, 4).join("\n")}\nscenario: ${JSON.stringify(input)}`);
        return true;
      }),
      { numRuns: Number(process.env.ORACLE_RUNS ?? 150) },
    );
    // Guard against a generator whose scenarios are all rejected (a test that could not fail).
    if (process.env.ORACLE_DEBUG) console.log(compared, runs, rejected);
    expect(compared).toBeGreaterThan(runs / 3);
  }, 120_000);
});
