/**
 * The weather and stand-down rules of sim/MODEL.md ("Weather", "Calendar"), worked by hand: each expected
 * time below is derived in the comment above it, and both the event engine and the hour-stepped reference
 * simulator must produce it. The formulas' own values are checked against published numbers where one exists.
 */
import { describe, expect, it } from "vitest";
import { compileScenario, simulate } from "../../sim/engine";
import { evaporationLbFt2h } from "../../sim/evaporation";
import { scenarioSchema, type Scenario } from "../../sim/schema";
import { hourlyRhPct, hourlyTempF, hourlyWindMph, saturationVaporPressureHpa } from "../../sim/weather";
import { referenceSimulate } from "../oracle/reference-sim";
import { at, deterministicCases, fixedSamples } from "../oracle/fixtures";

function caseNamed(prefix: string): Scenario {
  const c = deterministicCases.find((x) => x.name.startsWith(prefix));
  if (!c) throw new Error(`no fixture "${prefix}"`);
  return scenarioSchema.parse(c.input);
}

/** Both simulators on one deterministic case: (op#packet) → [start, finish] from each. */
function runBoth(s: Scenario) {
  const eng = simulate(compileScenario(s), fixedSamples(s), { trace: true });
  const ref = referenceSimulate(s, fixedSamples(s), 0.25, 60);
  const key = (p: { op: string; packet: number }) => `${p.op}#${p.packet}`;
  const e = new Map(eng.trace!.packets.map((p) => [key(p), [p.start, p.finish]]));
  const r = new Map(ref.packets.map((p) => [key(p), [p.start, p.finish]]));
  /** The packet's [start, finish], the same in both simulators (else the test fails here). */
  const packet = (op: string, i: number): number[] => {
    const a = e.get(`${op}#${i}`)!;
    const b = r.get(`${op}#${i}`)!;
    expect(a, `engine ${op}#${i}`).toBeDefined();
    expect(b[0], `reference start ${op}#${i}`).toBeCloseTo(a[0], 9);
    expect(b[1], `reference finish ${op}#${i}`).toBeCloseTo(a[1], 9);
    return a;
  };
  return { eng, ref, packet };
}

describe("formulas against published values", () => {
  it("Magnus saturation vapour pressure (Alduchov & Eskridge 1996 coefficients)", () => {
    // e_s(20 °C) = 6.1094·exp(17.625·20 / (20 + 243.04)) = 6.1094·exp(1.340100) = 6.1094 × 3.819427 = 23.334 hPa.
    expect(saturationVaporPressureHpa(20)).toBeCloseTo(23.334, 3);
    // Published: 23.37 hPa over water at 20 °C (WMO/Smithsonian tables, from memory); Alduchov & Eskridge
    // (1996) give the form's relative error as under 0.4 % from −40 to 50 °C (from memory): 23.334 is 0.15 % off.
    expect(Math.abs(saturationVaporPressureHpa(20) / 23.37 - 1)).toBeLessThan(0.004);
    // At 0 °C the form returns its coefficient, 6.1094 hPa (tables: 6.112 hPa, from memory).
    expect(saturationVaporPressureHpa(0)).toBeCloseTo(6.1094, 10);
    expect(Math.abs(saturationVaporPressureHpa(0) / 6.112 - 1)).toBeLessThan(0.004);
  });

  it("hourly RH at the daily minimum and maximum (dew point of the daily mean, MODEL.md)", () => {
    // Fixed day 50–70 °F, RH 60 %. Mean 60 °F = 15.556 °C, e_s = 17.638 hPa; dew-point vapour = 0.60 × 17.638.
    // At 06:00 (50 °F = 10 °C, e_s 12.260): RH = 60 × 17.638 / 12.260 = 86.32 %.
    // At 15:00 (70 °F = 21.111 °C, e_s 24.989): RH = 60 × 17.638 / 24.989 = 42.35 %.
    const s = caseNamed("one crew, two operations");
    s.weather = { ...s.weather, monthly: s.weather.monthly.map((m) => ({ ...m, tminMeanF: 50, tmaxMeanF: 70, rhMean: 60 })) };
    const w = fixedSamples(s).weather;
    expect(hourlyTempF(w, 30)).toBeCloseTo(50, 9);
    expect(hourlyRhPct(w, 30)).toBeCloseTo(86.32, 2);
    expect(hourlyRhPct(w, 39)).toBeCloseTo(42.35, 2);
    // The hour of the daily mean temperature has the day's RH: the rise passes 60 °F at 10:30, so RH(10) > 60 > RH(11).
    expect(hourlyRhPct(w, 34)).toBeGreaterThan(60);
    expect(hourlyRhPct(w, 35)).toBeLessThan(60);
  });

  it("the evaporation gate reads the hour's RH and wind: 0.20 lb/ft²/h at 15:00 where the daily values gave 0.11", () => {
    // Fixed day 66–86 °F, RH 68 %, wind 8 mph, concrete = air + 3 °F (fixture "hourly wind and humidity").
    // 15:00: air 86 °F = 30 °C, concrete 89 °F = 31.667 °C. Mean 76 °F = 24.444 °C, e_s 30.585 hPa; e_s(30 °C)
    // = 42.367 hPa → RH = 68 × 30.585 / 42.367 = 49.09 %. Wind 8 × (1 + 0.3·cos 0) = 10.4 mph = 16.737 km/h.
    // Uno (1998): E = 5·[(31.667 + 18)^2.5 − 0.4909·(30 + 18)^2.5]·(16.737 + 4)·10⁻⁶
    //   = 5·[17,384.5 − 0.4909 × 15,962.6] × 20.737 × 10⁻⁶ = 0.9900 kg/m²/h = 0.2028 lb/ft²/h (× 0.20482).
    // With the daily RH 68 % and wind 8 mph the same hour gave 0.1128 lb/ft²/h, under the 0.15 limit.
    const s = caseNamed("hourly wind and humidity");
    const w = fixedSamples(s).weather;
    const k = 15; // Monday 15:00
    expect(hourlyRhPct(w, k)).toBeCloseTo(49.09, 2);
    expect(hourlyWindMph(w, k)).toBeCloseTo(10.4, 12);
    expect(evaporationLbFt2h(hourlyTempF(w, k) + 3, hourlyTempF(w, k), hourlyRhPct(w, k), hourlyWindMph(w, k))).toBeCloseTo(0.2028, 4);
    expect(evaporationLbFt2h(89, 86, 68, 8)).toBeCloseTo(0.1128, 4);
    // 07:00: air 66.60 °F, RH 93.5 %, wind 8 × (1 + 0.3·cos(−120°)) = 6.8 mph → E = 0.0233: pours pass.
    expect(hourlyWindMph(w, 7)).toBeCloseTo(6.8, 12);
    expect(evaporationLbFt2h(hourlyTempF(w, 7) + 3, hourlyTempF(w, 7), hourlyRhPct(w, 7), hourlyWindMph(w, 7))).toBeCloseTo(0.0233, 4);
    // Wind gate 9 mph on that 8 mph day: W(10) = 8 × (1 + 0.3·cos(−75°)) = 8.62 passes, W(11) = 8 × 1.15 = 9.2 fails.
    expect(hourlyWindMph(w, 10)).toBeCloseTo(8.621, 3);
    expect(hourlyWindMph(w, 11)).toBeCloseTo(9.2, 12);
    const { eng, ref } = runBoth(s);
    expect(eng.unfinished).toBe(false);
    expect(ref.finish).toBeCloseTo(eng.finish, 9);
    // No sweep production in slots 11–19 of any day (W > 9 mph there).
    for (const p of eng.trace!.packets.filter((x) => x.op === "sweep")) {
      for (let t = Math.floor(p.start); t < p.finish; t++) expect([11, 12, 13, 14, 15, 16, 17, 18, 19]).not.toContain(t % 24);
    }
  });
});

describe("weather gates as specifications write them (hand-worked, engine = reference)", () => {
  it("rising is judged from the temperature: a warm night pour, which the old 06–15 clock rule never allowed", () => {
    // June days 50–60 °F: every night falls (15:00 60 °F → 06:00 50 °F), so no night candidate rises.
    // 30 June's afternoon 60 °F falls "towards" 1 July's 70 °F minimum, i.e. rises all night:
    // T(21:00) = 70 + (60 − 70)·(1 + cos(6π/15))/2 = 70 − 6.545 = 63.45, T(22:00) = 70 − 10·(1 + cos(7π/15))/2 = 64.48.
    // Night window 21:00–05:00, 2 h pours: p0 30 June 21–23 (t = 2·24 + 21 = 69), p1 23–01, p2 01–03.
    const s = caseNamed("rising: a warm night pour");
    const w = fixedSamples(s).weather;
    expect(hourlyTempF(w, 69)).toBeCloseTo(63.45, 2);
    expect(hourlyTempF(w, 70)).toBeCloseTo(64.48, 2);
    expect(hourlyTempF(w, 22)).toBeLessThan(hourlyTempF(w, 21)); // Monday night falls
    const { packet } = runBoth(s);
    expect(packet("placement", 0)).toEqual([69, 71]);
    expect(packet("placement", 1)).toEqual([71, 73]);
    expect(packet("placement", 2)).toEqual([73, 75]);
  });

  it("protectAfter: no pour whose next 12 h hold a slot below 40 °F", () => {
    // Days 30–60 °F. Rise: T(h) = 30 + 15·(1 − cos(π(h − 6)/9)): T(9) = 37.5, T(10) = 42.40.
    // Fall: T = 30 + 15·(1 + cos(π(h − 15)/15)): T(24) = 40.36, T(25) = 37.5. So slots 10–23 are warm (≥ 40 at
    // both ends) and slot 24 (00:00–01:00) is not. A 2 h pour finishing at f needs slots floor(f)…⌈f + 12⌉ − 1
    // warm: f = 10 (slots 10–21) and f = 12 (12–23) pass; f = 14 reaches slot 24 and fails.
    // Window 08–16: p0 08–10, p1 10–12 each day; 10 packets → Friday p8 104–106, p9 106–108.
    // (Without protection 4 pours a day: p9 Wednesday 10–12 = 58.)
    const s = caseNamed("protectAfter");
    const w = fixedSamples(s).weather;
    expect(hourlyTempF(w, 10)).toBeCloseTo(42.4, 1);
    expect(hourlyTempF(w, 24)).toBeCloseTo(40.36, 2);
    expect(hourlyTempF(w, 25)).toBeCloseTo(37.5, 9);
    const { eng, packet } = runBoth(s);
    expect(packet("placement", 0)).toEqual([8, 10]);
    expect(packet("placement", 1)).toEqual([10, 12]);
    expect(packet("placement", 2)).toEqual([32, 34]);
    expect(packet("placement", 9)).toEqual([106, 108]);
    expect(eng.finish).toBe(108);
  });

  it("a 24 h cure counted above 45 °F straddles two cold nights", () => {
    // Days 30–60 °F. Rise: T(10) = 42.40, T(11) = 30 + 15·(1 − cos(100°)) = 47.60; fall: T(22) = 30 + 15·(1 +
    // cos(84°)) = 46.57, T(23) = 30 + 15·(1 + cos(96°)) = 43.43. Warm slots (both ends ≥ 45): 11–21, 11 h a day.
    // Placement 12.5 ft/h → 8 h: p0 Mon 08–16, p1 Tue 08–16 (32–40).
    // Cure p0 from Mon 16:00: Mon 16–22 = 6 h, Tue 11–22 = 11 h (17), Wed 11:00 + 7 h → Wed 18:00 = 2·24 + 18 = 66.
    // Cure p1 from Tue 16:00: 6 + 11 on Wed, Thu 11–18 → 3·24 + 18 = 90. (Counting every hour: 40 and 64.)
    // Striping (1 h, open 08–16): p0 ready Wed 18:00 → Thu 08–09 (80–81); p1 ready Thu 18:00 → Fri 104–105.
    const s = caseNamed("cure counted");
    const w = fixedSamples(s).weather;
    expect(hourlyTempF(w, 11)).toBeCloseTo(47.6, 1);
    expect(hourlyTempF(w, 22)).toBeCloseTo(46.57, 2);
    expect(hourlyTempF(w, 23)).toBeCloseTo(43.43, 2);
    const { eng, packet } = runBoth(s);
    expect(packet("placement", 1)).toEqual([32, 40]);
    expect(packet("cure", 0)).toEqual([16, 66]);
    expect(packet("cure", 1)).toEqual([40, 90]);
    expect(packet("striping", 0)).toEqual([80, 81]);
    expect(eng.finish).toBe(105);
  });

  it("maxTempF 85 °F on 60–90 °F days leaves 08:00–12:00", () => {
    // Rise: T(h) = 60 + 15·(1 − cos(π(h − 6)/9)): T(12) = 60 + 15·1.5 = 82.5, T(13) = 60 + 15·(1 − cos 140°) = 86.49.
    // Fall: T(19) = 60 + 15·(1 + cos 48°) = 85.04, T(20) = 82.5. In the 08–16 window slots 8–11 pass (slot 12
    // ends at 86.49): 4 h a day. Milling 1,000 ft at 50 ft/h = 20 h → Mon–Fri 08–12, finish Fri 12:00 = 108.
    const s = caseNamed("maxTempF");
    const w = fixedSamples(s).weather;
    expect(hourlyTempF(w, 13)).toBeCloseTo(86.49, 2);
    const { eng, packet } = runBoth(s);
    expect(packet("milling", 1)).toEqual([10, 12]);
    expect(packet("milling", 2)).toEqual([32, 34]);
    expect(eng.finish).toBe(108);
  });
});

describe("holiday stand-down settings (MODEL.md, Calendar)", () => {
  it("from 06:00 the day before and through the Monday", () => {
    // 4 July 2026 is a Saturday, observed Friday 3 July (5 U.S.C. 6103); the block Fri 3–Sun 5 ends on a Sunday,
    // so with standDownThroughMonday Monday 6 July joins it; blocked from Thu 2 July 06:00 to Tue 7 July 00:00.
    // Milling 2 h packets, open 08–16 from Mon 29 June: p0–p3 Mon, p4–p7 Tue, p8–p11 Wed; Thursday is blocked
    // from 06:00; Tue 7 July (t = 8·24 = 192): p12 200–202 … p15 206–208; Wed: p16 224–226 … p19 230–232.
    // (Default 15:00 and no Monday: Thursday p12–p14 and an hour of p15, which ends Mon 6 July 09:00.)
    const s = caseNamed("stand-down from 06:00");
    expect(at(s, "2026-07-07")).toBe(192);
    const { eng, packet } = runBoth(s);
    expect(packet("milling", 11)).toEqual([62, 64]);
    expect(packet("milling", 12)).toEqual([200, 202]);
    expect(eng.finish).toBe(232);

    const byDefault = scenarioSchema.parse({ ...s, calendar: { ...s.calendar, holidays: { ...s.calendar.holidays, standDownStartHour: 15, standDownThroughMonday: false } } });
    const d = runBoth(byDefault);
    expect(d.packet("milling", 14)).toEqual([84, 86]);
    expect(d.packet("milling", 15)).toEqual([86, at(s, "2026-07-06", 9)]);
  });
});
