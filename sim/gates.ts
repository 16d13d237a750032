/**
 * Weather gates per hour slot (MODEL.md, "Weather"). Contract: `slotOk(profile, k)` tells whether hour
 * slot [k, k+1) of the current iteration's weather passes every per-slot gate of a gate profile:
 * minimum and maximum temperature at both ends, no rain, maximum wind W(k), maximum evaporation (Uno 1998
 * via `./evaporation`, concrete = air + concreteDeltaF at the slot's start, RH and wind of hour k) and, for
 * non-continuous operations, `rising` (not falling: T(k+1) ≥ T(k)). Operations with identical gates share
 * one profile. Results are computed lazily, slot by slot, and cached as per-day bit masks; hourly
 * temperatures are cached too. The caches are allocated once per compiled scenario and invalidated per
 * iteration by a generation stamp (no clearing), so a new iteration costs nothing until a slot is asked for.
 * Also: `rising(k)`, `warmSlot(c, k)` (both ends ≥ c) and the day bounds the protection window and the
 * warm-hour cure use to skip whole days.
 */
import { evaporationLbFt2h } from "./evaporation";
import type { CrewOperation } from "./schema";
import { dewPointVaporHpa, hourlyTempF, rhFromVapor, WIND_FACTOR, WIND_FACTOR_MAX, WIND_FACTOR_MIN, type WeatherSeries } from "./weather";
import { hourlyHigh, hourlyLow, overrideRainBits, type ActiveOverride } from "./weather-override-reads"; // forecast override

export interface GateProfile {
  minTempF: number; // -Infinity when absent
  maxTempF: number; // Infinity when absent
  noRain: boolean;
  maxWindMph: number; // Infinity when absent
  maxEvaporation: number; // Infinity when absent
  concreteDeltaF: number;
  risingEverySlot: boolean;
}

/** The per-slot profile of an operation, or null when no per-slot gate applies. */
export function gateProfileOf(op: CrewOperation): GateProfile | null {
  const g = op.gates;
  const p: GateProfile = {
    minTempF: g.minTempF ?? -Infinity,
    maxTempF: g.maxTempF ?? Infinity,
    noRain: g.noRain === true,
    maxWindMph: g.maxWindMph ?? Infinity,
    maxEvaporation: g.maxEvaporation ?? Infinity,
    concreteDeltaF: g.concreteDeltaF ?? 0,
    risingEverySlot: g.rising === true && !op.continuous,
  };
  const none =
    p.minTempF === -Infinity && p.maxTempF === Infinity && !p.noRain && p.maxWindMph === Infinity && p.maxEvaporation === Infinity && !p.risingEverySlot;
  return none ? null : p;
}

export function profileKey(p: GateProfile): string {
  return JSON.stringify([p.minTempF, p.maxTempF, p.noRain, p.maxWindMph, p.maxEvaporation, p.maxEvaporation === Infinity ? 0 : p.concreteDeltaF, p.risingEverySlot]);
}

/** Days drawn ahead of the one asked for (see `need`). */
const WEATHER_CHUNK_DAYS = 15;

// Day flags per (profile, day).
const TEMP_ALL_PASS = 1;
const DAY_FAILS = 2;
const WIND_ALL_PASS = 4;
const EVAP_ALL_PASS = 8;
const ALL_PASS = TEMP_ALL_PASS | WIND_ALL_PASS | EVAP_ALL_PASS;
const ALL_SLOTS = 0xffffff; // bits 0–23

export class GateCache {
  private series: WeatherSeries | null = null;
  // forecast override: its hours [ovFrom, ovTo); +∞…−∞ (empty) without one, so a read costs one failed comparison.
  private ov: ActiveOverride | null = null;
  private ovFrom = Infinity;
  private ovTo = -Infinity;
  private gen = 0;
  private readonly stride: number;
  private readonly stamp: Int32Array;
  private readonly computed: Int32Array;
  private readonly pass: Int32Array;
  private readonly dayFlags: Int32Array;
  private readonly rainStamp: Int32Array;
  private readonly rainBits: Int32Array;
  private readonly vaporStamp: Int32Array;
  private readonly vapor: Float64Array;
  private readonly tempStamp: Int32Array;
  private readonly temp: Float64Array;
  private ensured = 0;
  /** Highest day index whose weather this iteration read, + 1 (the benchmark's floor draws as many). */
  daysUsed = 0;

  constructor(
    private readonly profiles: GateProfile[],
    days: number,
  ) {
    this.stride = days + 2;
    const n = Math.max(1, profiles.length) * this.stride;
    this.stamp = new Int32Array(n);
    this.computed = new Int32Array(n);
    this.pass = new Int32Array(n);
    this.dayFlags = new Int32Array(n);
    this.rainStamp = new Int32Array(this.stride);
    this.rainBits = new Int32Array(this.stride);
    this.vaporStamp = new Int32Array(this.stride);
    this.vapor = new Float64Array(this.stride);
    this.tempStamp = new Int32Array(this.stride * 24 + 1);
    this.temp = new Float64Array(this.stride * 24 + 1);
  }

  /** forecast override: some hour read for day d's slots (ends 24d … 24d + 24 included) comes from the forecast. */
  private overrideTouchesDay(d: number): boolean {
    return 24 * d + 25 > this.ovFrom && 24 * d < this.ovTo;
  }

  /** Start a new iteration on `series` (invalidates every cached slot). */
  reset(series: WeatherSeries, override: ActiveOverride | null = null): void {
    this.series = series;
    this.ov = override; // forecast override
    this.ovFrom = override ? override.fromHour : Infinity; // forecast override
    this.ovTo = override ? override.toHour : -Infinity; // forecast override
    this.gen++;
    this.ensured = 0;
    this.daysUsed = 0;
  }

  // Hot reads below are split into a small hit path and an out-of-line miss path: V8 inlines a callee only
  // within a per-function budget of bytecode, and the misses' code would spend it on every caller.
  private need(day: number): WeatherSeries {
    if (day + 2 > this.ensured) this.drawAhead(day);
    if (day + 1 > this.daysUsed) this.daysUsed = day + 1;
    return this.series!;
  }

  private drawAhead(day: number): void {
    // Days come in chunks: the series' stream is private and drawn in day order, so drawing a few days
    // ahead changes no value, and one call per chunk instead of one per day saves the call's set-up.
    this.ensured = day + 2 + WEATHER_CHUNK_DAYS;
    this.series!.ensure(this.ensured);
  }

  tempAt(hour: number): number {
    return this.tempStamp[hour] === this.gen ? this.temp[hour] : this.tempMiss(hour);
  }

  private tempMiss(hour: number): number {
    const s = this.need(Math.floor(hour / 24));
    const v = hour >= this.ovFrom && hour < this.ovTo ? this.ov!.tempF[hour - this.ovFrom] : hourlyTempF(s, hour); // forecast override
    this.tempStamp[hour] = this.gen;
    this.temp[hour] = v;
    return v;
  }

  /**
   * Slot [k, k+1) is not falling (MODEL.md, `rising`). Slots 06–14 lie on the 06:00–15:00 rise from tmin to
   * tmax ≥ tmin, both ends from the same increasing formula: they rise without computing a temperature.
   */
  rising(k: number): boolean {
    const h = k - 24 * Math.floor(k / 24);
    if (h >= 6 && h < 15 && !(k + 1 >= this.ovFrom && k < this.ovTo)) return true; // forecast override: read the hours
    return this.tempAt(k + 1) >= this.tempAt(k);
  }

  /**
   * The first whole hour after a falling slot k that can start a rising slot. Slots 06–15 always rise
   * (tmin ≤ tmax); the fall from 15:00 to 06:00 is strictly monotone when the afternoon is warmer than the
   * next morning's minimum, so no slot of it rises: skip to 06:00 at once. Otherwise the next hour.
   */
  nextRisingFrom(k: number): number {
    if (k + 16 > this.ovFrom && k < this.ovTo) return k + 1; // forecast override: the skip below assumes the climate's curve
    const d = Math.floor(k / 24);
    const h = k - 24 * d;
    if (h >= 6 && h < 15) return k + 1;
    const from = h >= 15 ? d : d - 1;
    const s = this.need(from + 1);
    const hi = s.tmaxF[from >= 0 ? from : 0];
    return hi > s.tminF[from + 1] ? 24 * (from + 1) + 6 : k + 1;
  }

  /** Both ends of slot [k, k+1) at or above `c` °F. */
  warmSlot(c: number, k: number): boolean {
    const d = (k / 24) | 0;
    if (this.dayLow(d) >= c) return true;
    return this.tempAt(k) >= c && this.tempAt(k + 1) >= c;
  }

  /**
   * Whole-day temperature bounds, exact: every hourly temperature of day d's slots (ends included) is a
   * half-cosine between two of tmin[d], tmin[d+1], tmax[d−1], tmax[d], so it lies between their minimum and
   * maximum (a warm night after a cold day can put tmax[d−1] below tmin[d]).
   */
  dayLow(d: number): number {
    if (this.overrideTouchesDay(d)) return hourlyLow(this, d); // forecast override
    const s = this.need(d);
    return Math.min(s.tminF[d], s.tminF[d + 1], s.tmaxF[d > 0 ? d - 1 : 0], s.tmaxF[d]);
  }

  dayHigh(d: number): number {
    if (this.overrideTouchesDay(d)) return hourlyHigh(this, d); // forecast override
    const s = this.need(d);
    return Math.max(s.tminF[d], s.tminF[d + 1], s.tmaxF[d > 0 ? d - 1 : 0], s.tmaxF[d]);
  }

  rainAt(k: number): boolean {
    const d = (k / 24) | 0;
    return (this.rainMask(d) & (1 << (k - 24 * d))) !== 0;
  }

  /** Day d's rain as 24 bits (slot h wet ⇔ bit h), the same rule as `isRainHour`, built once per day. */
  private rainMask(d: number): number {
    return this.rainStamp[d] === this.gen ? this.rainBits[d] : this.rainMiss(d);
  }

  private rainMiss(d: number): number {
    const s = this.need(d);
    let bits = 0;
    if (s.wet[d] === 1) {
      const lo = s.rainStartHour[d];
      const hi = Math.min(24, lo + s.rainHours[d]);
      if (hi > lo) bits |= ((1 << (hi - lo)) - 1) << lo;
    }
    if (d > 0 && s.wet[d - 1] === 1) {
      const spill = s.rainStartHour[d - 1] + s.rainHours[d - 1] - 24;
      if (spill > 0) bits |= (1 << Math.min(24, spill)) - 1;
    }
    if (24 * d + 24 > this.ovFrom && 24 * d < this.ovTo) bits = overrideRainBits(this.ov!, d, bits); // forecast override
    this.rainStamp[d] = this.gen;
    this.rainBits[d] = bits;
    return bits;
  }

  /** Day d's dew-point vapour pressure (hPa), once per day. */
  private vaporOf(d: number): number {
    return this.vaporStamp[d] === this.gen ? this.vapor[d] : this.vaporMiss(d);
  }

  private vaporMiss(d: number): number {
    const v = dewPointVaporHpa(this.need(d), d);
    this.vaporStamp[d] = this.gen;
    this.vapor[d] = v;
    return v;
  }

  slotOk(profile: number, k: number): boolean {
    const d = (k / 24) | 0;
    const bit = 1 << (k - 24 * d);
    const at = profile * this.stride + d;
    if (this.stamp[at] !== this.gen) this.firstOfDay(profile, d, at);
    if (this.computed[at] & bit) return (this.pass[at] & bit) !== 0;
    const ok = this.evaluate(this.profiles[profile], k, d, this.dayFlags[at]);
    this.computed[at] |= bit;
    if (ok) this.pass[at] |= bit;
    return ok;
  }

  /**
   * The first slot of day d asked for `profile`: its day bounds, and when they pass temperature, wind and
   * evaporation for the whole day (and no slot must rise), every slot's answer at once — its rain alone decides.
   */
  private firstOfDay(profile: number, d: number, at: number): void {
    const p = this.profiles[profile];
    const flags = this.dayBounds(p, d);
    this.stamp[at] = this.gen;
    this.dayFlags[at] = flags;
    if ((flags & ALL_PASS) === ALL_PASS && !p.risingEverySlot) {
      this.computed[at] = ALL_SLOTS;
      this.pass[at] = p.noRain ? ALL_SLOTS & ~this.rainMask(d) : ALL_SLOTS;
    } else {
      this.computed[at] = 0;
      this.pass[at] = 0;
    }
  }

  /** What holds for every slot of day d: whole-day pass or fail of temperature and wind, evaporation pass. */
  private dayBounds(p: GateProfile, d: number): number {
    if (this.overrideTouchesDay(d)) return p.maxEvaporation === Infinity ? EVAP_ALL_PASS : 0; // forecast override: every slot read
    const s = this.need(d);
    const lo = this.dayLow(d);
    const hi = this.dayHigh(d);
    const w = s.windMph[d];
    if (w * WIND_FACTOR_MIN > p.maxWindMph || hi < p.minTempF || lo > p.maxTempF) return DAY_FAILS;
    let flags = 0;
    if (lo >= p.minTempF && hi <= p.maxTempF) flags |= TEMP_ALL_PASS;
    if (w * WIND_FACTOR_MAX <= p.maxWindMph) flags |= WIND_ALL_PASS;
    if (p.maxEvaporation === Infinity || this.evaporationPassesAllDay(p, d, hi, w)) flags |= EVAP_ALL_PASS;
    return flags;
  }

  /**
   * Every slot of day d passes the evaporation gate. Uno's rate rises with the air temperature (concrete = air
   * + δ, δ ≥ 0, at a fixed humidity), falls with the humidity — itself falling as the air warms, the dew point
   * fixed for the day — and rises with the wind; so the day's warmest air, its humidity there and the strongest
   * wind bound every slot. One exponential a day instead of one per slot; the margin keeps rounding (ulps,
   * against a 1e-9 relative margin) from passing a slot the exact check would fail, so no result changes.
   */
  private evaporationPassesAllDay(p: GateProfile, d: number, hi: number, w: number): boolean {
    if (p.concreteDeltaF < 0) return false; // cooler concrete: the rate may fall as the air warms
    const bound = evaporationLbFt2h(hi + p.concreteDeltaF, hi, rhFromVapor(this.vaporOf(d), hi), w * WIND_FACTOR_MAX);
    return bound <= p.maxEvaporation * (1 - 1e-9);
  }

  private evaluate(p: GateProfile, k: number, d: number, flags: number): boolean {
    if (flags & DAY_FAILS) return false;
    if (p.noRain && (this.rainMask(d) & (1 << (k - 24 * d))) !== 0) return false;
    if (!(flags & TEMP_ALL_PASS)) {
      const a = this.tempAt(k);
      const b = this.tempAt(k + 1);
      if (a < p.minTempF || b < p.minTempF || a > p.maxTempF || b > p.maxTempF) return false;
    }
    if (p.risingEverySlot && !this.rising(k)) return false;
    const s = this.series!;
    const wind = k >= this.ovFrom && k < this.ovTo ? this.ov!.windMph[k - this.ovFrom] : s.windMph[d] * WIND_FACTOR[k - 24 * d]; // forecast override
    if (!(flags & WIND_ALL_PASS) && wind > p.maxWindMph) return false;
    if (!(flags & EVAP_ALL_PASS)) {
      // Exact, hour by hour, on days the whole-day bound (`evaporationPassesAllDay`) did not clear.
      const air = this.tempAt(k);
      const rh = k >= this.ovFrom && k < this.ovTo ? this.ov!.rhPct[k - this.ovFrom] : rhFromVapor(this.vaporOf(d), air); // forecast override
      if (evaporationLbFt2h(air + p.concreteDeltaF, air, rh, wind) > p.maxEvaporation) return false;
    }
    return true;
  }
}
