/**
 * The engine against the hour-stepped reference simulator when the samples carry a weather forecast
 * (MODEL.md, "Re-forecast from the weather forecast"): the reference reads the forecast hour by hour, the engine
 * through its gate cache (whole-day bounds, rain masks, the rising shortcut), so any read that misses the
 * forecast shows up as a packet at another time. Forecasts here are invented, hour by hour, with values the
 * climate never has (temperatures that rise at night, rain chances between 0 and 100 %, dry gusty afternoons).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileScenario, drawSamples, parseScenario, simulate, type Scenario } from "../../sim/index";
import { formatDayNumber, parseIsoDate } from "../../sim/dates";
import { weatherOverride, type HourlyInput, type WeatherOverride } from "../../sim/forecast-weather";
import { createRng } from "../../sim/random";
import type { IterationSamples } from "../../sim/samples";
import { withRain } from "../../sim/weather-override-reads";
import { referenceSimulate, type RefResult } from "../oracle/reference-sim";
import { baseInput, climate, crewOp, fixedSamples, stochasticInput, type Input } from "../oracle/fixtures";

const DT = 0.25;

function parsed(input: unknown): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(`scenario rejected: ${r.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  return r.scenario;
}

interface ForecastSpec {
  /** Days after the start date of the first forecast day. */
  fromDay: number;
  days: number;
  /** Per day: low, high (°F), PoP pattern, humidity and wind of the afternoon. */
  perDay: { lo: number; span: number; pop: "dry" | "wet" | "mixed"; rhPm: number; windPm: number }[];
  /** Seeds the hour-to-hour wobble (the test's own stream). */
  wobble: number;
}

/** An invented hourly forecast: a daily swing with a wobble of up to ±4 °F, so some nights rise and some mornings fall. */
function forecastOf(s: Scenario, f: ForecastSpec): WeatherOverride {
  const rng = createRng(`wobble:${f.wobble}`);
  const first = formatDayNumber(parseIsoDate(s.startDate) + f.fromDay);
  const h: HourlyInput = { firstDate: first, tempF: [], popPct: [], rhPct: [], windMph: [] };
  for (const d of f.perDay.slice(0, f.days)) {
    for (let hour = 0; hour < 24; hour++) {
      const swing = (1 - Math.cos((2 * Math.PI * (hour - 3)) / 24)) / 2; // lowest at 03:00, highest at 15:00
      h.tempF.push(Math.round(d.lo + d.span * swing + (rng.next() - 0.5) * 8));
      h.popPct.push(d.pop === "dry" ? 0 : d.pop === "wet" ? 100 : Math.round(rng.next() * 100));
      const pm = hour >= 12 && hour < 19;
      h.rhPct.push(pm ? d.rhPm : Math.min(100, d.rhPm + 30));
      h.windMph.push(pm ? d.windPm : Math.max(0, d.windPm - 8));
    }
  }
  const o = weatherOverride(s, h, formatDayNumber(parseIsoDate(first) - 1));
  if (!o) throw new Error("the invented forecast has no whole day");
  return o;
}

const daySpec = fc.record({
  lo: fc.integer({ min: 20, max: 75 }),
  span: fc.integer({ min: 0, max: 30 }),
  pop: fc.constantFrom("dry" as const, "wet" as const, "mixed" as const),
  rhPm: fc.integer({ min: 10, max: 90 }),
  windPm: fc.integer({ min: 0, max: 30 }),
});
const forecastSpec = (maxFromDay: number) =>
  fc.record({
    fromDay: fc.integer({ min: 0, max: maxFromDay }),
    days: fc.integer({ min: 1, max: 6 }),
    perDay: fc.array(daySpec, { minLength: 6, maxLength: 6 }),
    wobble: fc.integer({ min: 0, max: 1_000_000 }),
  });

interface EnginePacket { op: string; stage?: string; packet: number; crew: number; start: number; finish: number }

/** Every packet either simulator finished by `until` must be the other's too, at the same times within `tol`. */
function disagreements(ref: RefResult, eng: EnginePacket[], tol: number, until: number): string[] {
  const byKey = new Map(eng.map((p) => [`${p.stage}/${p.op}#${p.packet}`, p]));
  const seen = new Set<string>();
  const out: string[] = [];
  for (const r of ref.packets) {
    if (r.finish > until) continue;
    const key = `${r.stage}/${r.op}#${r.packet}`;
    seen.add(key);
    const e = byKey.get(key);
    if (!e) out.push(`${key}: reference ${r.start}→${r.finish}, engine has no such packet`);
    else if (Math.abs(e.start - r.start) > tol || Math.abs(e.finish - r.finish) > tol)
      out.push(`${key}: reference ${r.start}→${r.finish}, engine ${e.start}→${e.finish}`);
  }
  for (const e of eng)
    if (e.finish <= until - tol && !seen.has(`${e.stage}/${e.op}#${e.packet}`)) out.push(`${e.op}#${e.packet}: engine ${e.start}→${e.finish}, reference did not finish it by ${until} h`);
  return out;
}

function enginePackets(s: Scenario, samples: IterationSamples): EnginePacket[] {
  return simulate(compileScenario(s), samples, { trace: true }).trace!.packets as EnginePacket[];
}

describe("reference vs engine with a weather forecast in the samples", () => {
  it("hand-made fixture: a forecast freeze night after a mild climate day moves the pour and the cure", () => {
    // Fixed climate 60–82 °F passes every gate; the forecast's Tuesday night drops to 28 °F, which the
    // protection window (40 °F for 12 h) and the warm-hour cure (≥ 50 °F) must both see.
    const input = baseInput();
    input.weather = { mode: "fixed", monthly: climate({ tminF: 60, tmaxF: 82 }) };
    input.operations = [
      crewOp("placement", 50, { continuous: true, gates: { minTempF: 45, rising: true, noRain: true, noRainHoursAfter: 2, protectAfter: { minTempF: 40, hours: 12 } } }),
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 20 }, countAboveF: 50 },
    ];
    input.links = [{ from: "placement", to: "cure" }];
    const s = parsed(input);
    const o = forecastOf(s, { fromDay: 1, days: 3, wobble: 7, perDay: [
      { lo: 28, span: 30, pop: "dry", rhPm: 40, windPm: 10 },
      { lo: 50, span: 20, pop: "mixed", rhPm: 50, windPm: 12 },
      { lo: 45, span: 25, pop: "dry", rhPm: 30, windPm: 20 },
      { lo: 0, span: 0, pop: "dry", rhPm: 0, windPm: 0 }, { lo: 0, span: 0, pop: "dry", rhPm: 0, windPm: 0 }, { lo: 0, span: 0, pop: "dry", rhPm: 0, windPm: 0 },
    ] });
    const samples = () => ({ ...fixedSamples(s), weatherOverride: withRain(o, "fixture", 0) });
    const ref = referenceSimulate(s, samples(), DT, 60);
    const eng = enginePackets(s, samples());
    expect(ref.unfinished).toBe(false);
    expect(disagreements(ref, eng, 1e-6, Infinity)).toEqual([]);
    // And the forecast matters: without it the same plan runs otherwise.
    expect(enginePackets(s, fixedSamples(s)).map((p) => p.finish)).not.toEqual(eng.map((p) => p.finish));
  });

  const starts = ["2027-04-05", "2027-05-17", "2027-10-25"];
  for (let k = 0; k < 9; k++) {
    it(`seeded stochastic scenario with every gate kind, seed oracle-f:${k} from ${starts[k % 3]}`, () => {
      const input = stochasticInput();
      input.startDate = starts[k % 3];
      const s = parsed(input);
      const spec = fc.sample(forecastSpec(10), { seed: 100 + k, numRuns: 1 })[0];
      const o = forecastOf(s, { ...spec, days: 6 });
      // drawSamples with the forecast: the same (seed, k) twice, one call per simulator.
      const ref = referenceSimulate(s, drawSamples(s, "oracle-f", k, undefined, o), DT, 800);
      const eng = enginePackets(s, drawSamples(s, "oracle-f", k, undefined, o));
      expect(ref.unfinished).toBe(false);
      expect(disagreements(ref, eng, DT, Infinity)).toEqual([]);
    });
  }

  it("generated small fixed-climate scenarios and forecasts agree on every packet within 60 days (fast-check)", () => {
    const quarter = (lo: number, hi: number) => fc.integer({ min: lo * 4, max: hi * 4 }).map((q) => q / 4);
    const opArb = fc.record({
      wait: fc.integer({ min: 0, max: 4 }).map((n) => n === 0),
      waitHours: quarter(1, 30),
      countAboveF: fc.option(fc.integer({ min: 35, max: 70 }), { nil: undefined }),
      crews: fc.integer({ min: 1, max: 2 }),
      rate: fc.integer({ min: 20, max: 150 }),
      continuous: fc.boolean(),
      minTempF: fc.option(fc.integer({ min: 35, max: 65 }), { nil: undefined }),
      maxTempF: fc.option(fc.integer({ min: 70, max: 95 }), { nil: undefined }),
      rising: fc.boolean(),
      noRain: fc.boolean(),
      noRainHoursAfter: quarter(0, 4),
      maxWindMph: fc.option(fc.integer({ min: 5, max: 25 }), { nil: undefined }),
      maxEvaporation: fc.option(fc.integer({ min: 5, max: 40 }).map((n) => n / 100), { nil: undefined }),
      concreteDeltaF: fc.integer({ min: 0, max: 12 }),
      protectAfter: fc.option(fc.record({ minTempF: fc.integer({ min: 30, max: 60 }), hours: quarter(0, 16) }), { nil: undefined }),
    });
    const arb = fc.record({
      startDay: fc.integer({ min: 0, max: 200 }),
      lengthFt: fc.integer({ min: 4, max: 16 }).map((n) => n * 50),
      workDays: fc.subarray([0, 1, 2, 3, 4, 5, 6], { minLength: 3 }),
      wetDays: fc.array(fc.integer({ min: 0, max: 20 }), { maxLength: 2 }),
      ops: fc.array(opArb, { minLength: 1, maxLength: 3 }),
      forecast: forecastSpec(8),
    });
    let compared = 0;
    fc.assert(
      fc.property(arb, (g) => {
        const x: Input = baseInput();
        const iso = (day: number) => formatDayNumber(parseIsoDate("2027-04-01") + day);
        x.startDate = iso(g.startDay);
        x.deck.lengthFt = g.lengthFt;
        x.calendar.workDays = g.workDays;
        x.calendar.shifts.push({ id: "long", name: "Long", startHour: 5, lengthHours: 18 });
        x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["weekday", "saturday", "sunday", "holiday"], startHour: 5, endHour: 23 });
        x.weather = { mode: "fixed", monthly: climate({ tminF: 50, tmaxF: 78 }), fixedWetDates: g.wetDays.map((d) => iso(g.startDay + d)) };
        x.operations = g.ops.map((o, i) =>
          o.wait
            ? { id: `op${i}`, name: `Op ${i}`, kind: "wait" as const, durationHours: { type: "fixed" as const, value: o.waitHours }, countAboveF: o.countAboveF }
            : crewOp(`op${i}`, o.rate, {
                crews: o.crews,
                shifts: ["long"],
                continuous: o.continuous,
                gates: {
                  minTempF: o.minTempF, maxTempF: o.maxTempF, rising: o.rising, noRain: o.noRain, maxWindMph: o.maxWindMph,
                  maxEvaporation: o.maxEvaporation, concreteDeltaF: o.concreteDeltaF,
                  ...(o.continuous ? { noRainHoursAfter: o.noRainHoursAfter, protectAfter: o.protectAfter } : {}),
                },
              }),
        );
        x.links = g.ops.slice(1).map((_, i) => ({ from: `op${i}`, to: `op${i + 1}` }));
        const p = parseScenario(x);
        if (!p.ok) return true; // refused by the validator (e.g. a pour longer than any open interval)
        const s = p.scenario;
        const o = forecastOf(s, g.forecast);
        const samples = () => ({ ...fixedSamples(s), weatherOverride: withRain(o, "gen", g.forecast.wobble) });
        const ref = referenceSimulate(s, samples(), DT, 60);
        const bad = disagreements(ref, enginePackets(s, samples()), 1e-6, 60 * 24);
        compared++;
        if (bad.length) throw new Error(`${bad.slice(0, 4).join("\n")}\nscenario: ${JSON.stringify(x)}\nforecast: ${JSON.stringify(g.forecast)}`);
        return true;
      }),
      {
        numRuns: Number(process.env.ORACLE_RUNS ?? 80),
        // Found by this property: packets of 100 ft at 150 ft/h end at 178.99999999999997 h, and the engine began
        // the next one in slot 178 for a sliver (MODEL.md: an instant within 1e-9 h below an hour is that hour).
        examples: [[{"startDay":0,"lengthFt":300,"workDays":[3,4,6],"wetDays":[],"ops":[{wait:false,"waitHours":1,"countAboveF":undefined,"crews":1,"rate":30,"continuous":false,"minTempF":undefined,"maxTempF":undefined,"rising":false,"noRain":false,"noRainHoursAfter":0,"maxWindMph":undefined,"maxEvaporation":undefined,"concreteDeltaF":0,"protectAfter":undefined},{wait:false,"waitHours":1,"countAboveF":undefined,"crews":1,"rate":34,"continuous":true,"minTempF":undefined,"maxTempF":undefined,"rising":false,"noRain":false,"noRainHoursAfter":0,"maxWindMph":undefined,"maxEvaporation":undefined,"concreteDeltaF":0,"protectAfter":undefined}],"forecast":{"fromDay":0,"days":1,"perDay":[{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0}],"wobble":0}}], [{ startDay: 0, lengthFt: 350, workDays: [0, 4, 6], wetDays: [], ops: [{ wait: false, waitHours: 1, countAboveF: undefined, crews: 1, rate: 150, continuous: false, minTempF: 62, maxTempF: undefined, rising: true, noRain: false, noRainHoursAfter: 0, maxWindMph: undefined, maxEvaporation: 0.05, concreteDeltaF: 0, protectAfter: undefined }], forecast: { fromDay: 6, days: 2, perDay: [{ lo: 20, span: 0, pop: "mixed", rhPm: 10, windPm: 0 }, { lo: 56, span: 9, pop: "dry", rhPm: 10, windPm: 0 }, { lo: 20, span: 0, pop: "dry", rhPm: 10, windPm: 0 }, { lo: 20, span: 0, pop: "dry", rhPm: 10, windPm: 0 }, { lo: 20, span: 0, pop: "dry", rhPm: 10, windPm: 0 }, { lo: 20, span: 0, pop: "dry", rhPm: 10, windPm: 0 }], wobble: 0 } }],
          // Found on 4 December 2026: a packet ended 10⁻¹⁴ h before the end of an open interval (406.99999999999994
          // for 407) and the engine began the next one there for a sliver, then paused until the next window —
          // a start 94 h early. An instant that close below the end is the end (sim/production.ts `produce`).
          [{"startDay":0,"lengthFt":750,"workDays":[3,4,5,6],"wetDays":[],"ops":[{"wait":false,"waitHours":1,"countAboveF":undefined,"crews":1,"rate":35,"continuous":false,"minTempF":58,"maxTempF":70,"rising":false,"noRain":false,"noRainHoursAfter":0,"maxWindMph":7,"maxEvaporation":undefined,"concreteDeltaF":0,"protectAfter":undefined}],"forecast":{"fromDay":0,"days":1,"perDay":[{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0},{"lo":20,"span":0,"pop":"dry","rhPm":10,"windPm":0}],"wobble":0}}]],
      },
    );
    expect(compared).toBeGreaterThan(40);
  }, 120_000);
});
