/**
 * A re-forecast that starts from the weather forecast (MODEL.md, "Re-forecast from the weather forecast"):
 * - the law: with the fixed-mode climate's own hourly values as the forecast, the re-forecast's summary is the
 *   plan re-forecast's, number for number (fast-check over generated decks, climates, gates and field records,
 *   and the full-size demo in fixed mode);
 * - worked by hand: a forecast cold night blocks the pours the climate would allow.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildAsBuilt, type ProgressRecord } from "../../sim/asbuilt";
import { formatDayNumber, formatHours, parseIsoDate } from "../../sim/dates";
import { compileScenario, type CompileOptions } from "../../sim/engine";
import { fixedModeHourly, weatherOverride, type HourlyInput } from "../../sim/forecast-weather";
import { runIterations } from "../../sim/montecarlo";
import { runSummarySchema } from "../../sim/run-summary-schema";
import type { Scenario, ScenarioInput } from "../../sim/schema";
import { summarizeRun, type RunSummary } from "../../sim/summary";
import { parseScenario } from "../../sim/validate";
import { loadScenario, small } from "./engine-fixtures";
import { demoFieldLog } from "../../scripts/demo-job";

function parsed(input: ScenarioInput): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}
const dayAfter = (iso: string, n: number) => formatDayNumber(parseIsoDate(iso) + n);

function reforecast(plan: Scenario, records: ProgressRecord[], dataDate: string, seed: string, iterations: number, forecast?: HourlyInput) {
  const options: CompileOptions = { asBuilt: buildAsBuilt(plan, records, dataDate) };
  if (forecast) options.weatherOverride = weatherOverride(plan, forecast, dataDate);
  const c = compileScenario(plan, options);
  return summarizeRun(c, runIterations(c, seed, 0, iterations));
}

/** The summary as stored (JSON), without the list of forecast days: what must not change. */
const numbersOf = (s: RunSummary) => JSON.stringify({ ...s, forecastDates: undefined });

describe("the law: a forecast equal to the fixed-mode climate changes nothing", () => {
  const climateArb = fc.record({ tmin: fc.integer({ min: 25, max: 65 }), span: fc.integer({ min: 8, max: 30 }), wind: fc.integer({ min: 2, max: 22 }), rh: fc.integer({ min: 20, max: 95 }) });
  const arb = fc.record({
    startDay: fc.integer({ min: 0, max: 240 }), // days after 2027-03-01
    months: fc.array(climateArb, { minLength: 12, maxLength: 12 }),
    wetDays: fc.array(fc.integer({ min: 0, max: 30 }), { maxLength: 4 }),
    dataDay: fc.integer({ min: -2, max: 12 }),
    forecastDays: fc.integer({ min: 1, max: 9 }),
    gates: fc.record({
      minTempF: fc.integer({ min: 30, max: 60 }),
      rising: fc.boolean(),
      noRainHoursAfter: fc.integer({ min: 0, max: 6 }),
      maxWindMph: fc.option(fc.integer({ min: 5, max: 25 }), { nil: undefined }),
      maxEvaporation: fc.option(fc.integer({ min: 3, max: 30 }).map((n) => n / 100), { nil: undefined }),
      protect: fc.option(fc.record({ minTempF: fc.integer({ min: 28, max: 55 }), hours: fc.integer({ min: 1, max: 24 }) }), { nil: undefined }),
    }),
    cureAboveF: fc.option(fc.integer({ min: 35, max: 65 }), { nil: undefined }),
    records: fc.array(fc.record({ op: fc.constantFrom("milling", "overlay"), from: fc.integer({ min: 0, max: 900 }), len: fc.integer({ min: 50, max: 400 }), day: fc.integer({ min: 0, max: 10 }) }), { maxLength: 4 }),
    seed: fc.string({ minLength: 1, maxLength: 6 }),
  });

  it("generated small decks: re-forecast with the climate's own hours = plan re-forecast (summary numbers identical)", () => {
    let bound = 0;
    fc.assert(
      fc.property(arb, (g) => {
        const start = formatDayNumber(parseIsoDate("2027-03-01") + g.startDay);
        const plan = parsed(
          small((s) => {
            s.startDate = start;
            s.weather = {
              mode: "fixed",
              monthly: g.months.map((m) => ({ tmaxMeanF: m.tmin + m.span, tmaxSdF: 0, tminMeanF: m.tmin, tminSdF: 0, pWetAfterDry: 0, pWetAfterWet: 0, windMeanMph: m.wind, rhMean: m.rh })),
              fixedWetDates: g.wetDays.map((d) => dayAfter(start, d)),
            };
            const [milling, overlay] = s.operations as Record<string, any>[];
            // Random rates, so the plan's own stream is drawn and must stay the same.
            milling.rate = { unit: "ftPerHour", dist: { type: "triangular", min: 35, mode: 50, max: 70 } };
            overlay.gates = {
              minTempF: g.gates.minTempF, rising: g.gates.rising, noRain: true, noRainHoursAfter: g.gates.noRainHoursAfter,
              maxWindMph: g.gates.maxWindMph, maxEvaporation: g.gates.maxEvaporation, concreteDeltaF: 5,
              ...(g.gates.protect ? { protectAfter: g.gates.protect } : {}),
            };
            s.operations!.push({ id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 24 }, countAboveF: g.cureAboveF });
            s.links!.push({ from: "overlay", to: "cure" });
          }),
        );
        const dataDate = dayAfter(start, g.dataDay);
        const records: ProgressRecord[] = g.records.map((r) => ({ workDate: dayAfter(start, Math.min(r.day, Math.max(0, g.dataDay))), shift: "day", operationId: r.op, fromStationFt: r.from, toStationFt: Math.min(1000, r.from + r.len) }));
        // A forecast issued on the data date, as the app's would be.
        const forecast = fixedModeHourly(plan, dataDate, g.forecastDays);
        const a = reforecast(plan, records, dataDate, g.seed, 12);
        const b = reforecast(plan, records, dataDate, g.seed, 12, forecast);
        expect(numbersOf(b)).toBe(numbersOf(a));
        // The days taken are the whole days after the data date, not before the start.
        const firstDay = Math.max(parseIsoDate(dataDate) + 1, parseIsoDate(start));
        const lastDay = parseIsoDate(dataDate) + g.forecastDays - 1;
        expect(b.forecastDates ?? []).toEqual(Array.from({ length: Math.max(0, lastDay - firstDay + 1) }, (_, i) => formatDayNumber(firstDay + i)));
        expect(a.forecastDates).toBeUndefined();
        // Guard against a law that holds only because the forecast days never matter: 20 °F colder days move the pours.
        const cold = { ...forecast, tempF: forecast.tempF.map((t) => (t === null ? null : t - 20)) };
        if (numbersOf(reforecast(plan, records, dataDate, g.seed, 12, cold)) !== numbersOf(a)) bound++;
        return true;
      }),
      { numRuns: 60 },
    );
    // About a quarter of generated cases read the forecast days (138 of 500 in one long run). At least 4 of 60:
    // a binomial(60, 0.25) falls that low about once in 10^5 runs, so the guard fails only when the law is idle.
    expect(bound).toBeGreaterThanOrEqual(4);
  }, 120_000);

  it("the full-size demo in fixed mode (stages, traffic, costs, cut-off) under way with its field log: the same summary", () => {
    // Fixed mode with the LMC evaporation limit at 0.15 lb/ft²/h: at 0.1 the fixed summer afternoons never pour.
    const input = structuredClone(loadScenario("kestrel-two-season.json")) as Record<string, any>;
    input.operations.find((o: { id: string }) => o.id === "placement").gates.maxEvaporation = 0.15;
    input.weather = { ...input.weather, mode: "fixed", fixedWetDates: ["2027-06-16", "2027-06-17", "2027-10-27"] };
    const plan = parsed(input as ScenarioInput);
    for (const today of ["2027-06-15", "2027-10-26"]) {
      const dataDate = dayAfter(today, -1);
      const records = demoFieldLog(plan, today); // the inspector's log up to the data date: placement is under way
      const forecast = fixedModeHourly(plan, dataDate, 7);
      const a = reforecast(plan, records, dataDate, "demo", 40);
      const b = reforecast(plan, records, dataDate, "demo", 40, forecast);
      expect(numbersOf(b)).toBe(numbersOf(a));
      expect(b.forecastDates).toEqual([1, 2, 3, 4, 5, 6].map((n) => dayAfter(dataDate, n)));
      // Not a law that holds because nothing reads those days: 20 °F colder days change the re-forecast.
      const cold = { ...forecast, tempF: forecast.tempF.map((t) => (t === null ? null : t - 20)) };
      expect(numbersOf(reforecast(plan, records, dataDate, "demo", 40, cold))).not.toBe(numbersOf(a));
    }
  });
});

describe("worked by hand: a forecast cold night blocks a pour the climate would allow", () => {
  // The small deterministic deck (fixed April climate: 50 °F at 06:00, 70 °F at 15:00, nights ≥ 50 °F), with the
  // overlay's air to stay ≥ 40 °F for 12 h after each pour. Data date Mon 2027-04-05, no records: crews start
  // Tue 00:00. Milling 50 ft/h, 2 h a packet, day shift 07–17: Tue p0–p4 (07–17), Wed p5–p9.
  // Climate: overlay (2 h pours, ≥ 45 °F) p0 Tue 09–11, p1 11–13, p2 13–15, p3 15–17; p4 ready 17:00 → Wed 07–09,
  // p5–p8 Wed 09–17; p9 ready Wed 17:00 → Thu 07–09. Finish Thu 2027-04-08 09:00.
  // Forecast: the climate's own hours, but 35 °F from Tue 22:00 to Wed 05:00. A Tuesday pour finishing at f
  // (≥ 11:00, as p0 is ready only at 09:00) protects [f, f + 12], which reaches 22:00: every Tuesday candidate
  // fails. Wednesday's first finish, 09:00, protects to 21:00, clear of the night. So p0–p4 Wed 07–17,
  // p5–p9 Thu 07–17: finish Thu 2027-04-08 17:00, and Tuesday is a shift lost to weather.
  const plan = parsed(small((s) => {
    (s.operations![1] as Record<string, any>).gates = { minTempF: 45, protectAfter: { minTempF: 40, hours: 12 } };
  }));
  const dataDate = "2027-04-05";

  it("with the climate's own hours the finish is Thursday 09:00; with the cold night, Thursday 17:00", () => {
    const climate = fixedModeHourly(plan, dataDate, 4);
    const coldNight: HourlyInput = { ...climate, tempF: climate.tempF.map((t, h) => (h >= 24 + 22 && h <= 48 + 5 ? 35 : t)) };
    expect(climate.tempF[24 + 22]).toBeGreaterThanOrEqual(50); // the climate's night would pass
    const base = reforecast(plan, [], dataDate, "hand", 1, climate);
    const cold = reforecast(plan, [], dataDate, "hand", 1, coldNight);
    expect(base.finishAt.p50).toBe("2027-04-08T09:00");
    expect(cold.finishAt.p50).toBe("2027-04-08T17:00");
    expect(cold.forecastDates).toEqual(["2027-04-06", "2027-04-07", "2027-04-08"]);
    // The list passes the strict run-result contract as stored, and a summary without it (older runs) still does.
    expect(runSummarySchema.safeParse(JSON.parse(JSON.stringify(cold))).success).toBe(true);
    expect(runSummarySchema.safeParse(JSON.parse(JSON.stringify({ ...cold, forecastDates: undefined }))).success).toBe(true);
    expect(runSummarySchema.safeParse(JSON.parse(JSON.stringify({ ...cold, forecastDates: ["8 Apr"] }))).success).toBe(false);
    expect(base.weatherLostShifts.p50).toBe(0);
    expect(cold.weatherLostShifts.p50).toBe(1);
    const pours = cold.representative.trace.packets.filter((p) => p.op === "overlay").map((p) => formatHours(parseIsoDate(plan.startDate), p.start));
    expect(pours).toEqual(["2027-04-07T07:00", "2027-04-07T09:00", "2027-04-07T11:00", "2027-04-07T13:00", "2027-04-07T15:00", "2027-04-08T07:00", "2027-04-08T09:00", "2027-04-08T11:00", "2027-04-08T13:00", "2027-04-08T15:00"]);
  });

  it("rain comes from the probability of precipitation, per iteration: PoP 100 all Wednesday stops Wednesday's pours", () => {
    const climate = fixedModeHourly(plan, dataDate, 4);
    const gated = parsed(small((s) => {
      (s.operations![1] as Record<string, any>).gates = { minTempF: 45, noRain: true };
    }));
    const wet: HourlyInput = { ...climate, popPct: climate.popPct.map((p, h) => (h >= 48 && h < 72 ? 100 : p)) };
    // Tue pours p0–p3 as in the climate; p4 ready Tue 17:00, Wednesday rains: Thu p4 07–09 … p8 15–17, p9 Fri 07–09.
    const s = reforecast(gated, [], dataDate, "hand", 3, wet);
    expect(s.finish.p10).toBe("2027-04-09");
    expect(s.finish.p90).toBe("2027-04-09");
  });
});
