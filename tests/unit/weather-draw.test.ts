/**
 * The inlined day generator (sim/weather-draw.ts) against the day loop written plainly with the shared samplers
 * (`normal`, `gammaCore` of sim/random.ts) — the WGEN description in sim/weather.ts's header, one uniform at a
 * time. The two must agree bit for bit on every column, for any climate, seed and chunking of `ensure`; the
 * parameters include the corners the inline code treats apart: rain always 1 h (q = 0) or 24 h (q = ∞), a
 * calm month (no wind draw), and enough days that the ziggurat's edge and the gamma's rejection both occur.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createWeatherSeries, rainHoursRatio, stationaryWetProbability } from "../../sim/weather";
import { createRng, gammaCore, normal, type Rng } from "../../sim/random";
import { civilFromDays, daysFromCivil, daysInMonth } from "../../sim/dates";
import { weatherSchema, type MonthClimate, type Weather } from "../../sim/schema";

/** How often the plain loop took a rare path: a normal past the ziggurat's rectangle, a gamma past its first trial. */
const rare = { normalEdges: 0, gammaRetries: 0 };

/** Days [0, n) of a stochastic series, drawn the plain way (the reference for the inlined loop). */
function plainDays(w: Weather, startDay: number, rng: Rng, n: number) {
  const inner = createRng(`wx${(rng.next() * 4294967296) >>> 0}:${(rng.next() * 4294967296) >>> 0}`);
  let uniforms = 0;
  const own: Rng = { next: () => (uniforms++, inner.next()) };
  const counted = <T,>(limit: number, key: keyof typeof rare, f: () => T): T => {
    const before = uniforms;
    const v = f();
    if (uniforms - before > limit) rare[key]++;
    return v;
  };
  const m = w.monthly;
  const rho = w.serialCorrelation;
  const innov = Math.sqrt(1 - rho * rho);
  const q = w.rainHoursMean <= 1 ? 0 : w.rainHoursMean >= 24 ? Infinity : rainHoursRatio(w.rainHoursMean);
  const d = 4 - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  const start = civilFromDays(startDay);
  let year = start.y;
  let month = start.m - 1;
  let dom = start.d;
  let prevWet = own.next() < stationaryWetProbability(m[month].pWetAfterDry, m[month].pWetAfterWet);
  let chiMax = normal(own);
  let chiMin = normal(own);
  const out = { tmaxF: [] as number[], tminF: [] as number[], windMph: [] as number[], rhPct: [] as number[], wet: [] as number[], rainStartHour: [] as number[], rainHours: [] as number[] };
  for (let i = 0; i < n; i++) {
    const x = m[month];
    const wet = own.next() < (prevWet ? x.pWetAfterWet : x.pWetAfterDry);
    prevWet = wet;
    chiMax = rho * chiMax + innov * counted(2, "normalEdges", () => normal(own));
    chiMin = rho * chiMin + innov * counted(2, "normalEdges", () => normal(own));
    const tmax = x.tmaxMeanF + (wet ? w.wetTmaxShiftF : 0) + x.tmaxSdF * chiMax;
    const tmin = x.tminMeanF + (wet ? w.wetTminShiftF : 0) + x.tminSdF * chiMin;
    out.tmaxF.push(tmax);
    out.tminF.push(Math.min(tmin, tmax - 1));
    out.windMph.push(x.windMeanMph / 4 > 0 ? counted(3, "gammaRetries", () => gammaCore(own, d, c, x.windMeanMph / 4)) : 0);
    out.rhPct.push(Math.min(100, x.rhMean + (wet ? 10 : 0)));
    out.wet.push(wet ? 1 : 0);
    if (wet) {
      out.rainStartHour.push(Math.floor(own.next() * 24));
      let h: number;
      if (q === 0) h = 1;
      else if (q === Infinity) h = 24;
      else {
        const u = own.next();
        h = Math.abs(Math.log(q)) < 1e-12 ? 1 + Math.floor(u * 24) : 1 + Math.floor(Math.log(1 - u * (1 - Math.pow(q, 24))) / Math.log(q));
        h = Math.min(24, Math.max(1, h));
      }
      out.rainHours.push(h);
    } else {
      out.rainStartHour.push(0);
      out.rainHours.push(0);
    }
    if (++dom > daysInMonth(year, month + 1)) {
      dom = 1;
      if (++month === 12) (month = 0), year++;
    }
  }
  return out;
}

const monthArb: fc.Arbitrary<MonthClimate> = fc.record({
  tmaxMeanF: fc.double({ min: 20, max: 100, noNaN: true }),
  tmaxSdF: fc.double({ min: 0, max: 12, noNaN: true }),
  spreadF: fc.double({ min: 0, max: 35, noNaN: true }),
  tminSdF: fc.double({ min: 0, max: 12, noNaN: true }),
  pWetAfterDry: fc.double({ min: 0, max: 1, noNaN: true }),
  pWetAfterWet: fc.double({ min: 0, max: 1, noNaN: true }),
  windMeanMph: fc.oneof(fc.constant(0), fc.double({ min: 0.5, max: 30, noNaN: true })),
  rhMean: fc.double({ min: 10, max: 100, noNaN: true }),
}).map(({ spreadF, ...m }) => ({ ...m, tminMeanF: m.tmaxMeanF - spreadF }));

const weatherArb = fc
  .record({
    monthly: fc.array(monthArb, { minLength: 12, maxLength: 12 }),
    serialCorrelation: fc.double({ min: 0, max: 0.95, noNaN: true }),
    rainHoursMean: fc.oneof(fc.constant(1), fc.constant(24), fc.double({ min: 1, max: 24, noNaN: true })),
    wetTmaxShiftF: fc.double({ min: -10, max: 0, noNaN: true }),
    wetTminShiftF: fc.double({ min: -5, max: 5, noNaN: true }),
  })
  .map((w) => weatherSchema.parse({ mode: "stochastic", ...w }));

describe("drawStochasticDays (the inlined day loop)", () => {
  it("equals the plain day loop bit for bit, for any climate, seed, start date and chunking of ensure", () => {
    fc.assert(
      fc.property(weatherArb, fc.string(), fc.integer({ min: 0, max: 3650 }), fc.array(fc.integer({ min: 1, max: 200 }), { maxLength: 6 }), (w, seed, offset, chunks) => {
        const startDay = daysFromCivil(2020, 1, 1) + offset;
        const n = 1200;
        const expected = plainDays(w, startDay, createRng(seed), n);
        const series = createWeatherSeries(w, startDay, createRng(seed));
        let at = 0;
        for (const c of chunks) series.ensure((at = Math.min(n, at + c)));
        series.ensure(n);
        for (const col of ["tmaxF", "tminF", "windMph", "rhPct", "wet", "rainStartHour", "rainHours"] as const) {
          expect(Array.from(series[col].subarray(0, n)), col).toEqual(expected[col]);
        }
      }),
      { numRuns: 40 },
    );
    // The rare paths the inline code hands back to ./random were taken (about 1 % of normals leave the
    // ziggurat's rectangles; 1,200 days draw thousands), so the comparison above covered them too.
    expect(rare.normalEdges).toBeGreaterThan(0);
    expect(rare.gammaRetries).toBeGreaterThan(0);
  });

});
