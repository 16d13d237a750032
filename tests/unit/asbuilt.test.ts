/**
 * Re-forecast from an as-built state (MODEL.md, "Re-forecast"): with no progress the re-forecast is the plan
 * bit for bit; with progress it never schedules work already done (fast-check over generated progress);
 * a hand-worked partial packet; mobilization of started operations; the discovery update by hand; curing.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildAsBuilt, DISCOVERY_PRIOR_PACKETS, type ProgressRecord } from "../../sim/asbuilt";
import { formatDayNumber, formatHours, parseIsoDate } from "../../sim/dates";
import { compileScenario, simulate } from "../../sim/engine";
import { runIterations } from "../../sim/montecarlo";
import { drawSamples, packetProbabilities } from "../../sim/samples";
import type { Scenario, ScenarioInput } from "../../sim/schema";
import { summarizeRun } from "../../sim/summary";
import { parseScenario } from "../../sim/validate";
import { loadScenario, small } from "./engine-fixtures";

function parsed(input: ScenarioInput): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}
const kestrel = parsed(loadScenario("kestrel-two-season.json"));
const smallDet = parsed(small());
const dayAfter = (iso: string, n: number) => formatDayNumber(parseIsoDate(iso) + n);

describe("re-forecast with no progress", () => {
  for (const [name, s] of [["Kestrel (stochastic)", kestrel], ["small deterministic", smallDet]] as const) {
    it(`equals the plan bit for bit for the same seed: ${name}`, () => {
      const plan = compileScenario(s);
      const re = compileScenario(s, { asBuilt: buildAsBuilt(s, [], dayAfter(s.startDate, -1)) });
      const a = runIterations(plan, "same", 0, 40);
      const b = runIterations(re, "same", 0, 40);
      expect(Array.from(b.finish)).toEqual(Array.from(a.finish));
      expect(Array.from(b.opFinish)).toEqual(Array.from(a.opFinish));
      expect(Array.from(b.season1End)).toEqual(Array.from(a.season1End));
      expect(Array.from(b.weatherLostShifts)).toEqual(Array.from(a.weatherLostShifts));
      expect(Array.from(b.discoveredHours)).toEqual(Array.from(a.discoveredHours));
      expect(Array.from(b.laneClosedHours)).toEqual(Array.from(a.laneClosedHours));
      expect(Array.from(b.laneClosedByClosure)).toEqual(Array.from(a.laneClosedByClosure));
      expect(JSON.stringify(summarizeRun(re, b))).toBe(JSON.stringify(summarizeRun(plan, a)));
    });
  }

  it("progress dated after the data date is ignored", () => {
    const late: ProgressRecord[] = [{ workDate: "2027-04-20", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 2000 }];
    const st = buildAsBuilt(kestrel, late, "2027-04-04");
    expect(st.entriesUsed).toBe(0);
    const a = runIterations(compileScenario(kestrel), "late", 0, 5);
    const b = runIterations(compileScenario(kestrel, { asBuilt: st }), "late", 0, 5);
    expect(Array.from(b.finish)).toEqual(Array.from(a.finish));
  });
});

// Generated progress: any crew operation, any stations (even off the deck's ends), any day up to the data date.
const recordArb = (s: Scenario) =>
  fc.record({
    op: fc.constantFrom(...s.operations.filter((o) => o.kind === "crew").map((o) => o.id)),
    from: fc.integer({ min: -50, max: s.deck.lengthFt }),
    len: fc.integer({ min: 1, max: Math.min(900, s.deck.lengthFt) }),
    day: fc.integer({ min: 0, max: 20 }),
    shift: fc.constantFrom(...s.calendar.shifts.map((x) => x.id)),
  });

function checkNeverRedone(s: Scenario, gen: { op: string; from: number; len: number; day: number; shift: string }[], dataDay: number, seed: string) {
  const records: ProgressRecord[] = gen.map((g) => ({
    workDate: dayAfter(s.startDate, g.day),
    shift: g.shift,
    operationId: g.op,
    fromStationFt: s.deck.startStationFt + g.from,
    toStationFt: s.deck.startStationFt + g.from + g.len,
  }));
  const st = buildAsBuilt(s, records, dayAfter(s.startDate, dataDay));
  const c = compileScenario(s, { asBuilt: st });
  const P = c.packets;
  for (let k = 0; k < 2; k++) {
    const r = simulate(c, drawSamples(c.scenario, seed, k), { trace: true });
    const seen = new Set<string>();
    const finishOf = new Map<string, number>();
    for (const p of r.trace!.packets) {
      const oi = s.operations.findIndex((o) => o.id === p.op);
      finishOf.set(`${oi}:${p.packet}`, p.finish);
      if (s.operations[oi].kind !== "crew") continue;
      // Never a packet already done, never before the data date (work or mobilization), each at most once.
      expect(st.ops[oi].remaining[p.packet]).toBeGreaterThan(0);
      expect(p.start).toBeGreaterThanOrEqual(st.dataTime);
      if (p.mobilizedFrom !== undefined) expect(p.mobilizedFrom).toBeGreaterThanOrEqual(st.dataTime);
      expect(seen.has(`${oi}:${p.packet}`)).toBe(false);
      seen.add(`${oi}:${p.packet}`);
    }
    st.ops.forEach((o, oi) => {
      for (let i = 0; i < P; i++) {
        const f = o.finish[i];
        if (f === null) continue;
        finishOf.set(`${oi}:${i}`, f);
        expect(r.opFinish[oi]).toBeGreaterThanOrEqual(f);
      }
    });
    // Precedence still holds against recorded finishes: a scheduled packet starts after its predecessors.
    for (const p of r.trace!.packets) {
      for (const l of s.links.filter((x) => x.to === p.op)) {
        const a = finishOf.get(`${s.operations.findIndex((o) => o.id === l.from)}:${p.packet}`);
        if (a !== undefined) expect(p.start).toBeGreaterThanOrEqual(a + l.lagHours - 1e-9);
      }
    }
  }
}

describe("re-forecast with progress never schedules work already done", () => {
  it("small deterministic deck, generated progress", () => {
    fc.assert(
      fc.property(fc.array(recordArb(smallDet), { maxLength: 8 }), fc.integer({ min: -1, max: 22 }), (gen, dataDay) => checkNeverRedone(smallDet, gen, dataDay, "g")),
      { numRuns: 120 },
    );
  });

  it("Kestrel (stochastic weather, discovery, cure, cut-off), generated progress", () => {
    fc.assert(
      fc.property(fc.array(recordArb(kestrel), { maxLength: 10 }), fc.integer({ min: 0, max: 22 }), fc.string({ minLength: 1, maxLength: 4 }), (gen, dataDay, seed) =>
        checkNeverRedone(kestrel, gen, dataDay, seed),
      ),
      { numRuns: 25 },
    );
  });
});

describe("hand-worked re-forecast (small deterministic deck)", () => {
  it("a half-done packet takes half its hours; the crew starts the day after the data date", () => {
    // Milling 0–150 ft recorded Mon 2027-04-05 (day shift 07–17): packet 0 done at Mon 17:00, packet 1 half done.
    // Data date Mon → forecast from Tue 00:00. Milling 50 ft/h: Tue 07–08 rest of p1 (50 ft), p2–p5 08–16,
    // p6 16–17 and Wed 07–08, p7–p9 08–14 → milling finish Wed 14:00.
    // Overlay (2 h a pour, continuous): p0 ready Mon 17:00 but crews start Tue → 07–09; p1–p4 follow milling
    // (09–11, 11–13, 13–15, 15–17); p5 ready 16:00 cannot fit before 17:00 → Wed 07–09; p6 ready 08:00 → 09–11;
    // p7 ready 10:00 → 11–13; p8 → 13–15; p9 ready 14:00 → 15–17. Finish Wed 2027-04-07T17:00.
    const st = buildAsBuilt(smallDet, [{ workDate: "2027-04-05", shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 150 }], "2027-04-05");
    expect(st.ops[0].remaining.slice(0, 3)).toEqual([0, 0.5, 1]);
    expect(st.ops[0].finish[0]).toBe(17);
    const c = compileScenario(smallDet, { asBuilt: st });
    const r = simulate(c, drawSamples(c.scenario, "hand", 0), { trace: true });
    const at = (h: number) => formatHours(c.calendar.startDay, h);
    const pk = (op: string, i: number) => r.trace!.packets.find((p) => p.op === op && p.packet === i);
    expect(pk("milling", 0)).toBeUndefined();
    expect([at(pk("milling", 1)!.start), at(pk("milling", 1)!.finish)]).toEqual(["2027-04-06T07:00", "2027-04-06T08:00"]);
    expect(at(r.opFinish[0])).toBe("2027-04-07T14:00");
    expect(at(pk("overlay", 0)!.start)).toBe("2027-04-06T07:00");
    expect(at(pk("overlay", 5)!.start)).toBe("2027-04-07T07:00");
    expect(at(r.finish)).toBe("2027-04-07T17:00");
  });
});

describe("mobilization in a re-forecast", () => {
  it("a started operation's crew is already mobilized; an operation not started still mobilizes", () => {
    // Setup (mobilization 8 h) has recorded progress; milling (6 h) has none.
    const st = buildAsBuilt(kestrel, [{ workDate: "2027-04-05", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 1600 }], "2027-04-05");
    const c = compileScenario(kestrel, { asBuilt: st });
    const r = simulate(c, drawSamples(c.scenario, "mob", 0), { trace: true });
    const first = (op: string) => r.trace!.packets.filter((p) => p.op === op).sort((a, b) => a.packet - b.packet)[0];
    expect(first("setup").packet).toBe(4);
    expect(first("setup").mobilizedFrom).toBeUndefined();
    expect(first("milling").mobilizedFrom).toBeGreaterThanOrEqual(st.dataTime);
    // The night shift of Apr 5 runs to 05:00 Apr 6, past the data time (24:00): the setup crew is busy until then.
    expect(c.asBuilt!.crewFree[0]).toBe(24 + 5);
    expect(first("setup").start).toBeGreaterThanOrEqual(29);
  });
});

describe("discovered-condition rate update (beta-binomial, pooled over the deck)", () => {
  it("matches the posterior mean worked by hand", () => {
    // Kestrel: default 0.12, survey STA 30+00–45+00 at 0.35. Hydrodemolition done over STA 12+00–22+00
    // (10 packets, all at the default 0.12); bottom-mat exposure recorded in 2 of them, one more item outside.
    // n0 = 20: prior Beta(2.4, 17.6). Posterior mean (20·p + 2)/(20 + 10):
    // default packets (2.4 + 2)/30 = 0.146666…; survey packets (7 + 2)/30 = 0.3.
    expect(DISCOVERY_PRIOR_PACKETS).toBe(20);
    const rec: ProgressRecord[] = [
      {
        workDate: "2027-04-06", shift: "night", operationId: "hydrodemolition", fromStationFt: 1200, toStationFt: 2200,
        discovered: [
          { kind: "bottom-mat", fromStationFt: 1310, toStationFt: 1330, areaSqFt: 60 },
          { kind: "full-depth", fromStationFt: 1750, toStationFt: 1760, areaSqFt: 24 },
        ],
      },
      // A milling entry does not inspect (milling does not discover), so its item is not in the 10.
      { workDate: "2027-04-06", shift: "night", operationId: "milling", fromStationFt: 2200, toStationFt: 2300, discovered: [{ kind: "bottom-mat", fromStationFt: 2210, toStationFt: 2220, areaSqFt: 10 }] },
    ];
    const st = buildAsBuilt(kestrel, rec, "2027-04-06");
    expect(st.discovery.inspected).toBe(10);
    expect(st.discovery.found).toBe(2);
    expect(st.discovered).toEqual({ items: 3, areaSqFt: 94, byKind: { "bottom-mat": 2, "full-depth": 1 } });
    const p = packetProbabilities(compileScenario(kestrel, { asBuilt: st }).scenario);
    expect(p[15]).toBeCloseTo(4.4 / 30, 12); // STA 27+00: default region
    expect(p[18]).toBeCloseTo(9 / 30, 12); // STA 30+00: survey range
    expect(Array.from(p)).toEqual(st.discovery.updated);
    // Nothing inspected: the plan's probabilities, exactly.
    const none = buildAsBuilt(kestrel, [rec[1]], "2027-04-06");
    expect(none.discovery.updated).toEqual(Array.from(packetProbabilities(kestrel)));
  });
});

describe("inspected packets when a condition is logged in a packet not yet finished", () => {
  it("counts the opened packet, so a logged condition is never '0 of 0 inspected'", () => {
    // Hydrodemolition has worked STA 12+00–12+40 of packet 0 (12+00–13+00) and found bottom-mat exposure at
    // 12+15–12+25: the packet is opened, so it is inspected and found (1 of 1). Posterior (20·0.12 + 1)/(20 + 1).
    const rec: ProgressRecord[] = [
      { workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 1700 },
      { workDate: "2027-04-06", shift: "night", operationId: "milling", fromStationFt: 1200, toStationFt: 1600 },
      {
        workDate: "2027-04-07", shift: "night", operationId: "hydrodemolition", fromStationFt: 1200, toStationFt: 1240,
        discovered: [{ kind: "bottom-mat", fromStationFt: 1215, toStationFt: 1225, areaSqFt: 38 }],
      },
    ];
    const st = buildAsBuilt(kestrel, rec, "2027-04-07");
    expect(st.discovery.inspected).toBe(1);
    expect(st.discovery.found).toBe(1);
    expect(st.discovery.updated[1]).toBeCloseTo((20 * 0.12 + 1) / 21, 12);
    // The same partial packet without a logged condition is not yet inspected: nothing is known about it.
    const plain = buildAsBuilt(kestrel, [rec[0], rec[1], { ...rec[2], discovered: [] }], "2027-04-07");
    expect(plain.discovery.inspected).toBe(0);
    expect(plain.discovery.updated).toEqual(plain.discovery.prior);
  });
});

describe("curing at the data date", () => {
  it("a placed packet cures for its nominal duration after placement (96 h here)", () => {
    // Placement day shift 07–17 on Apr 12 over packet 0 → cure since Apr 12 17:00 (+0 h lag), nominal end
    // Apr 16 17:00. Data date Apr 13 → curing; data date Apr 16 (24:00) → cured, not listed.
    const rec: ProgressRecord[] = [{ workDate: "2027-04-12", shift: "day", operationId: "placement", fromStationFt: 1200, toStationFt: 1300 }];
    const since = 7 * 24 + 17;
    expect(buildAsBuilt(kestrel, rec, "2027-04-13").curing).toEqual([{ op: "cure", stage: "whole-deck", packet: 0, since, nominalFinish: since + 96 }]);
    expect(buildAsBuilt(kestrel, rec, "2027-04-16").curing).toEqual([]);
  });
});
