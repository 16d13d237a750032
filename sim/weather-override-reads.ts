/**
 * What the gate reads (./gates) see of a re-forecast's weather forecast (MODEL.md, "Re-forecast from the
 * weather forecast"): inside [fromHour, toHour) the forecast's hourly value, the climate series' otherwise.
 * Contract: an `ActiveOverride` is one iteration's override with its rain drawn (`withRain`); the gate cache
 * keeps its range as two numbers (an empty range, +∞…−∞, without one), so a read without a forecast costs one
 * failed comparison. The functions here run only for hours or days the range touches:
 * - `overrideRainBits(o, d, bits)`: day d's 24 rain bits with the forecast's hours replaced;
 * - `hourlyLow` / `hourlyHigh(src, d)`: the exact lowest / highest slot-end temperature of day d's slots
 *   (whole hours 24d … 24d + 24), read through the cache, for days where the climate's whole-day bounds
 *   (from tmin/tmax) do not hold.
 */
import { drawOverrideRain, type WeatherOverride } from "./forecast-weather";

export interface ActiveOverride extends WeatherOverride {
  /** Per hour of the override (index h − fromHour): 1 when this iteration's hour is wet. */
  rain: Uint8Array;
}

/** Iteration k's override: the forecast with its rain drawn from the PoP (`reuse` lends its buffer). */
export function withRain(o: WeatherOverride, seed: string, k: number, reuse?: ActiveOverride | null): ActiveOverride {
  const buf = reuse && reuse.rain.length === o.popPct.length ? reuse.rain : undefined;
  return { ...o, rain: drawOverrideRain(o, seed, k, buf) };
}

/** Day d's rain bits (bit h = slot 24d + h wet) with every hour inside the override taken from it. */
export function overrideRainBits(o: ActiveOverride, d: number, seriesBits: number): number {
  let bits = seriesBits;
  for (let h = 0; h < 24; h++) {
    const k = 24 * d + h;
    if (k < o.fromHour || k >= o.toHour) continue;
    if (o.rain[k - o.fromHour] === 1) bits |= 1 << h;
    else bits &= ~(1 << h);
  }
  return bits;
}

interface HourlyTemps {
  tempAt(hour: number): number;
}

/** The lowest temperature at the whole hours 24d … 24d + 24 (both ends of every slot of day d). */
export function hourlyLow(src: HourlyTemps, d: number): number {
  let lo = Infinity;
  for (let k = 24 * d; k <= 24 * d + 24; k++) {
    const t = src.tempAt(k);
    if (t < lo) lo = t;
  }
  return lo;
}

/** The highest temperature at the whole hours 24d … 24d + 24. */
export function hourlyHigh(src: HourlyTemps, d: number): number {
  let hi = -Infinity;
  for (let k = 24 * d; k <= 24 * d + 24; k++) {
    const t = src.tempAt(k);
    if (t > hi) hi = t;
  }
  return hi;
}
