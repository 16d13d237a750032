/**
 * Daily weather for one Monte Carlo iteration, and the hourly view the weather gates read.
 * Contract:
 * - `createWeatherSeries(weather, startDay, rng, reuse?)` returns a series whose day index 0 is day number
 *   `startDay` (see `./dates`). Days are generated lazily and in order: `ensure(n)` makes days `< n`
 *   available; the typed arrays are replaced when they grow, so read them through the series object.
 *   `reuse`, a series the caller no longer reads, lends its arrays (the Monte Carlo loop recycles them
 *   instead of allocating per iteration); it must not be read again. Days are written before they are read,
 *   so the recycled contents never show.
 * - In stochastic mode the series takes exactly two uniforms from `rng` when it is created and seeds a
 *   private stream with them, so the weather of an iteration does not depend on when or how often the
 *   caller asks for more days, nor on what else the caller draws from `rng`. Fixed mode draws nothing.
 * - Fixed mode (MODEL.md): monthly means every day, no rain except `fixedWetDates` (rain 00:00–24:00,
 *   temperatures still the means), wind `windMeanMph`, humidity `rhMean`.
 * - Stochastic mode, WGEN family (Richardson 1981, Water Resources Research 17(1); Richardson & Wright 1984,
 *   USDA-ARS ARS-8): a two-state first-order Markov chain for wet days with the month's P(W|D), P(W|W);
 *   tmax = tmaxMeanF + (wet ? wetTmaxShiftF : 0) + tmaxSdF·χ, likewise tmin, so the monthly means are the
 *   dry-day means. Each residual χ follows χᵢ = ρ χᵢ₋₁ + √(1 − ρ²) εᵢ with ρ = `serialCorrelation`: a
 *   simplification of WGEN's A/B matrices that keeps the lag-1 autocorrelation but drops the tmax–tmin
 *   cross-correlation. tmin is then capped at tmax − 1 °F. On a wet day rain starts at a uniform whole hour
 *   0–23 and lasts 1–24 h, from a geometric law truncated at 24 h whose parameter is solved so that the
 *   mean is exactly `rainHoursMean`; rain may run past midnight. Wind: gamma, shape 4, mean `windMeanMph`.
 *   Humidity: `rhMean`, +10 on wet days, at most 100.
 * - `hourlyTempF`: minimum tmin at 06:00, maximum tmax at 15:00, half-cosine rise between them and
 *   half-cosine fall from 15:00 to 06:00 of the next day (continuous at midnight). Before 06:00 of day 0,
 *   day 0's own tmax stands in for the missing previous afternoon.
 * - `hourlyRhPct(series, k)`: the day's dew point holds the day's RH at the daily mean temperature
 *   (tmax + tmin)/2; RH(k) = 100·e_s(T_d)/e_s(T(k)) = rh_day·e_s(T_mean)/e_s(T(k)), at most 100, with the
 *   Magnus formula (`saturationVaporPressureHpa`). The day is that of hour k.
 * - `hourlyWindMph(series, k)`: W_day·(1 + 0.3·cos(2π(h − 15)/24)), h the clock hour of k (`WIND_FACTOR`).
 * Per generated day nothing is allocated and no Date object is used.
 */
import type { Weather } from "./schema";
import { civilFromDays, daysInMonth, parseIsoDate } from "./dates";
import { createRng, normal, type AleaRng, type Rng } from "./random";
import { drawStochasticDays, type DayColumns, type StochasticConstants } from "./weather-draw";

/** The day columns (./weather-draw `DayColumns`: tmaxF, tminF, windMph, rhPct, wet = 1 on a wet day, rain start and hours). */
export interface WeatherSeries extends DayColumns {
  readonly startDay: number;
  /** Days generated so far. */
  length: number;
  ensure(days: number): void;
}

/** π = P(W|D) / (1 − P(W|W) + P(W|D)); a chain that never leaves the dry state (0, 1) counts as dry. */
export function stationaryWetProbability(pWetAfterDry: number, pWetAfterWet: number): number {
  const denom = 1 - pWetAfterWet + pWetAfterDry;
  return denom > 0 ? pWetAfterDry / denom : 0;
}

const WIND_SHAPE = 4;
// gamma(rng, WIND_SHAPE, θ)'s constants, once (θ > 0 is tested per day, as `gamma` would).
const WIND_D = WIND_SHAPE - 1 / 3;
const WIND_C = 1 / Math.sqrt(9 * WIND_D);
const MAX_RAIN_HOURS = 24;

/** Mean of P(h) ∝ q^{h−1}, h = 1…24. */
function truncatedGeometricMean(q: number): number {
  let num = 0;
  let den = 0;
  let w = 1;
  for (let h = 1; h <= MAX_RAIN_HOURS; h++) {
    num += h * w;
    den += w;
    w *= q;
  }
  return num / den;
}

/** The ratio q whose truncated geometric has the given mean (bisection on ln q; the mean rises with q). */
export function rainHoursRatio(mean: number): number {
  let lo = -30;
  let hi = 30;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (truncatedGeometricMean(Math.exp(mid)) < mean) lo = mid;
    else hi = mid;
  }
  return Math.exp((lo + hi) / 2);
}

const INITIAL_CAPACITY = 512;

/** Per-profile constants, computed once per `Weather` object (the engine reuses it every iteration). */
interface Prepared extends StochasticConstants {
  pi: Float64Array;
  windMean: Float64Array;
  fixedWet: Set<number>;
}
const prepared = new WeakMap<Weather, Prepared>();

function prepare(weather: Weather): Prepared {
  const hit = prepared.get(weather);
  if (hit) return hit;
  const m = weather.monthly;
  const col = (f: (x: (typeof m)[number]) => number) => Float64Array.from(m, f);
  const rainMean = weather.rainHoursMean;
  const q = rainMean <= 1 ? 0 : rainMean >= MAX_RAIN_HOURS ? Infinity : rainHoursRatio(rainMean);
  const rho = weather.serialCorrelation;
  const p: Prepared = {
    tmaxMean: col((x) => x.tmaxMeanF),
    tmaxSd: col((x) => x.tmaxSdF),
    tminMean: col((x) => x.tminMeanF),
    tminSd: col((x) => x.tminSdF),
    pWD: col((x) => x.pWetAfterDry),
    pWW: col((x) => x.pWetAfterWet),
    pi: col((x) => stationaryWetProbability(x.pWetAfterDry, x.pWetAfterWet)),
    windScale: col((x) => x.windMeanMph / WIND_SHAPE),
    windMean: col((x) => x.windMeanMph),
    rh: col((x) => x.rhMean),
    fixedWet: new Set(weather.fixedWetDates.map(parseIsoDate)),
    rho,
    innov: Math.sqrt(1 - rho * rho),
    wetMaxShift: weather.wetTmaxShiftF,
    wetMinShift: weather.wetTminShiftF,
    q,
    lnQ: Math.log(q),
    oneMinusQ24: 1 - Math.pow(q, MAX_RAIN_HOURS),
    windD: WIND_D,
    windC: WIND_C,
  };
  prepared.set(weather, p);
  return p;
}

export function createWeatherSeries(weather: Weather, startDay: number, rng: Rng, reuse?: WeatherSeries): WeatherSeries {
  const P = prepare(weather);
  const own: AleaRng | null =
    weather.mode === "stochastic" ? createRng(`wx${(rng.next() * 4294967296) >>> 0}:${(rng.next() * 4294967296) >>> 0}`) : null;

  // Calendar position of the next day to generate, stepped day by day (no Date, no allocation):
  // [year, month 0–11, day of month, month length].
  const start = civilFromDays(startDay);
  const cal = Int32Array.of(start.y, start.m - 1, start.d, daysInMonth(start.y, start.m));

  // Generator state: "yesterday" before day 0 is drawn from the stationary law of the first month. Kept in
  // a typed array: doubles captured by the closure and rewritten every day would each be boxed.
  const chain = new Float64Array(3); // [previous day wet (0/1), χ of tmax, χ of tmin]
  if (own) {
    chain[0] = own.next() < P.pi[cal[1]] ? 1 : 0;
    chain[1] = normal(own);
    chain[2] = normal(own);
  }

  const series: WeatherSeries = {
    startDay,
    length: 0,
    tmaxF: reuse ? reuse.tmaxF : new Float64Array(INITIAL_CAPACITY),
    tminF: reuse ? reuse.tminF : new Float64Array(INITIAL_CAPACITY),
    windMph: reuse ? reuse.windMph : new Float64Array(INITIAL_CAPACITY),
    rhPct: reuse ? reuse.rhPct : new Float64Array(INITIAL_CAPACITY),
    wet: reuse ? reuse.wet : new Uint8Array(INITIAL_CAPACITY),
    rainStartHour: reuse ? reuse.rainStartHour : new Uint8Array(INITIAL_CAPACITY),
    rainHours: reuse ? reuse.rainHours : new Uint8Array(INITIAL_CAPACITY),
    ensure(days: number) {
      if (days <= series.length) return;
      if (days > series.tmaxF.length) grow(days);
      if (own) drawStochasticDays(own, P, chain, cal, series, series.length, days);
      else fixedDays(P, startDay, cal, series, series.length, days);
      series.length = days;
    },
  };

  function grow(days: number) {
    let cap = series.tmaxF.length;
    while (cap < days) cap *= 2;
    const f = (a: Float64Array) => {
      const b = new Float64Array(cap);
      b.set(a);
      return b;
    };
    const u = (a: Uint8Array) => {
      const b = new Uint8Array(cap);
      b.set(a);
      return b;
    };
    series.tmaxF = f(series.tmaxF);
    series.tminF = f(series.tminF);
    series.windMph = f(series.windMph);
    series.rhPct = f(series.rhPct);
    series.wet = u(series.wet);
    series.rainStartHour = u(series.rainStartHour);
    series.rainHours = u(series.rainHours);
  }

  return series;
}

/** Fixed mode's days [from, to) (MODEL.md): the monthly means, rain only on `fixedWetDates`. */
function fixedDays(P: Prepared, startDay: number, cal: Int32Array, out: DayColumns, from: number, to: number): void {
  const { tmaxF, tminF, windMph, rhPct, wet: wetA, rainStartHour, rainHours } = out;
  for (let i = from; i < to; i++) {
    const mo = cal[1];
    const wet = P.fixedWet.size > 0 && P.fixedWet.has(startDay + i);
    tmaxF[i] = P.tmaxMean[mo];
    tminF[i] = P.tminMean[mo];
    windMph[i] = P.windMean[mo];
    rhPct[i] = P.rh[mo];
    wetA[i] = wet ? 1 : 0;
    rainStartHour[i] = 0;
    rainHours[i] = wet ? 24 : 0;
    if (++cal[2] > cal[3]) {
      cal[2] = 1;
      if (++cal[1] === 12) {
        cal[1] = 0;
        cal[0]++;
      }
      cal[3] = daysInMonth(cal[0], cal[1] + 1);
    }
  }
}

const RISE_HOURS = 9; // 06:00 → 15:00
const FALL_HOURS = 15; // 15:00 → 06:00 next day

// The half-cosine weights at whole hours, (1 ∓ cos)/2, computed with the very expression used for
// fractional hours: halving is exact, so a table value gives the same bits as the inline formula.
const RISE_W = Float64Array.from({ length: RISE_HOURS + 1 }, (_, i) => (1 - Math.cos((Math.PI * i) / RISE_HOURS)) / 2);
const FALL_W = Float64Array.from({ length: FALL_HOURS + 1 }, (_, i) => (1 + Math.cos((Math.PI * i) / FALL_HOURS)) / 2);

/** Air temperature at `hour` (hours since 00:00 of day 0, may be fractional). */
export function hourlyTempF(series: WeatherSeries, hour: number): number {
  if (hour < 0) hour = 0; // no weather before day 0
  const d = Math.floor(hour / 24);
  if (d + 1 >= series.length) series.ensure(d + 2);
  const h = hour - d * 24;
  const whole = h === Math.floor(h);
  if (h >= 6 && h <= 15) {
    const lo = series.tminF[d];
    const w = whole ? RISE_W[h - 6] : (1 - Math.cos((Math.PI * (h - 6)) / RISE_HOURS)) / 2;
    return lo + (series.tmaxF[d] - lo) * w;
  }
  // Falling branch from the afternoon of day `from` to 06:00 of day `from + 1`.
  const from = h > 15 ? d : d - 1;
  const since = h > 15 ? h - 15 : h + 9;
  const hi = from >= 0 ? series.tmaxF[from] : series.tmaxF[0];
  const lo = series.tminF[from + 1];
  const w = whole ? FALL_W[since] : (1 + Math.cos((Math.PI * since) / FALL_HOURS)) / 2;
  return lo + (hi - lo) * w;
}

/** True when rain falls in the hour slot [k, k + 1); k counts hours since 00:00 of day 0. */
export function isRainHour(series: WeatherSeries, hourSlot: number): boolean {
  const k = Math.floor(hourSlot);
  const d = Math.floor(k / 24);
  if (d >= series.length) series.ensure(d + 1);
  const h = k - d * 24;
  if (d >= 0 && series.wet[d] === 1) {
    const s = series.rainStartHour[d];
    if (h >= s && h < s + series.rainHours[d]) return true;
  }
  // Yesterday's rain that ran past midnight.
  const p = d - 1;
  if (p >= 0 && series.wet[p] === 1) {
    const end = series.rainStartHour[p] + series.rainHours[p];
    if (h + 24 < end) return true;
  }
  return false;
}

/**
 * Saturation vapour pressure over water, hPa, at `tC` °C: the Magnus form e_s = 6.1094·exp(17.625·T/(T + 243.04))
 * (Alduchov & Eskridge 1996, "Improved Magnus form approximation of saturation vapor pressure", J. Appl.
 * Meteor. 35(4), 601–609; their recommended coefficients).
 */
export function saturationVaporPressureHpa(tC: number): number {
  return 6.1094 * Math.exp((17.625 * tC) / (tC + 243.04));
}

const fToC = (f: number) => ((f - 32) * 5) / 9;

/** e_s at the day's dew point: rh_day/100 · e_s(daily mean temperature), hPa. */
export function dewPointVaporHpa(series: WeatherSeries, day: number): number {
  return (series.rhPct[day] / 100) * saturationVaporPressureHpa(fToC((series.tmaxF[day] + series.tminF[day]) / 2));
}

/** RH (%) at air temperature `airF` with a dew-point vapour pressure `vaporHpa`, capped at 100. */
export function rhFromVapor(vaporHpa: number, airF: number): number {
  const rh = (100 * vaporHpa) / saturationVaporPressureHpa(fToC(airF));
  return rh > 100 ? 100 : rh;
}

/** Relative humidity (%) at the whole hour `k` (MODEL.md, "Weather"). */
export function hourlyRhPct(series: WeatherSeries, k: number): number {
  const d = Math.floor(k / 24);
  if (d + 1 >= series.length) series.ensure(d + 2);
  return rhFromVapor(dewPointVaporHpa(series, d), hourlyTempF(series, k));
}

/**
 * Diurnal wind factor by clock hour: 1 + 0.3·cos(2π(h − 15)/24), strongest at 15:00 (1.3), weakest at 03:00
 * (0.7), mean 1 over the day. The 30 % amplitude is common practice, no published source.
 */
export const WIND_FACTOR: Float64Array = Float64Array.from({ length: 24 }, (_, h) => 1 + 0.3 * Math.cos((2 * Math.PI * (h - 15)) / 24));
export const WIND_FACTOR_MIN = Math.min(...WIND_FACTOR);
export const WIND_FACTOR_MAX = Math.max(...WIND_FACTOR);

/** Wind (mph) in the hour slot starting at the whole hour `k`. */
export function hourlyWindMph(series: WeatherSeries, k: number): number {
  const h = Math.floor(k);
  const d = Math.floor(h / 24);
  if (d >= series.length) series.ensure(d + 1);
  return series.windMph[d] * WIND_FACTOR[h - 24 * d];
}
