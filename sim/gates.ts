/**
 * Weather gates per hour slot (MODEL.md, "Weather"). Contract: `slotOk(profile, k)` tells whether hour
 * slot [k, k+1) of the current iteration's weather passes every per-slot gate of a gate profile:
 * minimum temperature at both ends, no rain, maximum wind, maximum evaporation (Uno 1998 via
 * `./evaporation`, concrete = air + concreteDeltaF at the slot's start) and, for non-continuous operations,
 * `rising` (06:00 ≤ hour < 15:00). Operations with identical gates share one profile. Results are computed
 * lazily, slot by slot, and cached as per-day bit masks; hourly temperatures are cached too. The caches
 * are allocated once per compiled scenario and invalidated per iteration by a generation stamp (no
 * clearing), so a new iteration costs nothing until a slot is asked for.
 */
import { evaporationLbFt2h } from "./evaporation";
import type { CrewOperation } from "./schema";
import { hourlyTempF, type WeatherSeries } from "./weather";

export interface GateProfile {
  minTempF: number; // -Infinity when absent
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
    noRain: g.noRain === true,
    maxWindMph: g.maxWindMph ?? Infinity,
    maxEvaporation: g.maxEvaporation ?? Infinity,
    concreteDeltaF: g.concreteDeltaF ?? 0,
    risingEverySlot: g.rising === true && !op.continuous,
  };
  const none = p.minTempF === -Infinity && !p.noRain && p.maxWindMph === Infinity && p.maxEvaporation === Infinity && !p.risingEverySlot;
  return none ? null : p;
}

export function profileKey(p: GateProfile): string {
  return JSON.stringify([p.minTempF, p.noRain, p.maxWindMph, p.maxEvaporation, p.maxEvaporation === Infinity ? 0 : p.concreteDeltaF, p.risingEverySlot]);
}

export function isRisingSlot(k: number): boolean {
  const h = k - 24 * Math.floor(k / 24);
  return h >= 6 && h < 15;
}

export class GateCache {
  private series: WeatherSeries | null = null;
  private gen = 0;
  private readonly stride: number;
  private readonly stamp: Int32Array;
  private readonly computed: Int32Array;
  private readonly pass: Int32Array;
  /** Per (profile, day): bit 0 temperature passes all day, bit 1 the whole day fails (cold or windy). */
  private readonly dayFlags: Int32Array;
  private readonly evapPass: Float64Array;
  private readonly dayHi: Float64Array;
  private readonly evapFail: Float64Array;
  private readonly rainStamp: Int32Array;
  private readonly rainBits: Int32Array;
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
    this.evapPass = new Float64Array(n);
    this.dayHi = new Float64Array(n);
    this.evapFail = new Float64Array(n);
    this.rainStamp = new Int32Array(this.stride);
    this.rainBits = new Int32Array(this.stride);
    this.tempStamp = new Int32Array(this.stride * 24 + 1);
    this.temp = new Float64Array(this.stride * 24 + 1);
  }

  /** Start a new iteration on `series` (invalidates every cached slot). */
  reset(series: WeatherSeries): void {
    this.series = series;
    this.gen++;
    this.ensured = 0;
    this.daysUsed = 0;
  }

  private need(day: number): WeatherSeries {
    const s = this.series!;
    if (day + 2 > this.ensured) {
      this.ensured = day + 2;
      s.ensure(this.ensured);
    }
    if (day + 1 > this.daysUsed) this.daysUsed = day + 1;
    return s;
  }

  tempAt(hour: number): number {
    if (this.tempStamp[hour] === this.gen) return this.temp[hour];
    const s = this.need(Math.floor(hour / 24));
    const v = hourlyTempF(s, hour);
    this.tempStamp[hour] = this.gen;
    this.temp[hour] = v;
    return v;
  }

  rainAt(k: number): boolean {
    const d = (k / 24) | 0;
    return (this.rainMask(d) & (1 << (k - 24 * d))) !== 0;
  }

  /** Day d's rain as 24 bits (slot h wet ⇔ bit h), the same rule as `isRainHour`, built once per day. */
  private rainMask(d: number): number {
    if (this.rainStamp[d] === this.gen) return this.rainBits[d];
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
    this.rainStamp[d] = this.gen;
    this.rainBits[d] = bits;
    return bits;
  }

  slotOk(profile: number, k: number): boolean {
    const d = (k / 24) | 0;
    const bit = 1 << (k - 24 * d);
    const at = profile * this.stride + d;
    if (this.stamp[at] !== this.gen) {
      this.stamp[at] = this.gen;
      this.computed[at] = 0;
      this.pass[at] = 0;
      this.dayFlags[at] = this.dayBounds(this.profiles[profile], profile, d);
      this.evapPass[at] = -Infinity;
      this.evapFail[at] = Infinity;
    } else if (this.computed[at] & bit) return (this.pass[at] & bit) !== 0;
    const ok = this.evaluate(this.profiles[profile], k, d, this.dayFlags[at], at);
    this.computed[at] |= bit;
    if (ok) this.pass[at] |= bit;
    return ok;
  }

  /**
   * Whole-day temperature shortcut, exact: every hourly temperature of day d's slots (ends included) is a
   * half-cosine between two of tmin[d], tmin[d+1], tmax[d−1], tmax[d], so it lies between their minimum and
   * maximum (a warm night after a cold day can put tmax[d−1] below tmin[d]).
   */
  private dayBounds(p: GateProfile, profile: number, d: number): number {
    const s = this.need(d);
    const a = s.tminF[d];
    const b = s.tminF[d + 1];
    const c = s.tmaxF[d > 0 ? d - 1 : 0];
    const e = s.tmaxF[d];
    const lo = Math.min(a, b, c, e);
    const hi = Math.max(a, b, c, e);
    let flags = 0;
    this.dayHi[profile * this.stride + d] = hi;
    if (s.windMph[d] > p.maxWindMph) return 2;
    if (p.minTempF !== -Infinity) flags |= lo >= p.minTempF ? 1 : hi < p.minTempF ? 2 : 0;
    return flags;
  }

  private evaluate(p: GateProfile, k: number, d: number, flags: number, at: number): boolean {
    if (flags & 2) return false;
    if (p.risingEverySlot && !isRisingSlot(k)) return false;
    if (p.noRain && (this.rainMask(d) & (1 << (k - 24 * d))) !== 0) return false;
    if (p.minTempF !== -Infinity && !(flags & 1) && (this.tempAt(k) < p.minTempF || this.tempAt(k + 1) < p.minTempF)) return false;
    if (p.maxEvaporation !== Infinity) {
      if (p.concreteDeltaF >= 0) {
        // Day's upper temperature bound passes ⇒ every slot of the day passes (monotone, see below).
        if (this.evapFail[at] === Infinity && this.evapPass[at] === -Infinity) {
          const s = this.series!;
          const hi = this.dayHi[at];
          if (evaporationLbFt2h(hi + p.concreteDeltaF, hi, s.rhPct[d], s.windMph[d]) <= p.maxEvaporation) this.evapPass[at] = Infinity;
          else this.evapFail[at] = hi;
        }
        if (this.evapPass[at] === Infinity) return true;
      }
      const air = this.tempAt(k);
      if (p.concreteDeltaF >= 0) {
        // With concrete ≥ air, Uno's E rises with the air temperature (∂E/∂T ∝ (Tc+18)^1.5 − r(Ta+18)^1.5 ≥ 0),
        // and wind and humidity are daily: within a day, a temperature at or below one known to pass passes,
        // at or above one known to fail fails; only temperatures in between need the formula.
        if (air <= this.evapPass[at]) return true;
        if (air >= this.evapFail[at]) return false;
        const s = this.series!;
        const ok = evaporationLbFt2h(air + p.concreteDeltaF, air, s.rhPct[d], s.windMph[d]) <= p.maxEvaporation;
        if (ok) this.evapPass[at] = air;
        else this.evapFail[at] = air;
        return ok;
      }
      const s = this.series!;
      if (evaporationLbFt2h(air + p.concreteDeltaF, air, s.rhPct[d], s.windMph[d]) > p.maxEvaporation) return false;
    }
    return true;
  }
}

/** Where gated work reports what it did (the engine's bookkeeping: closure hours, lost shifts, trace). */
export interface WorkSink {
  /** Production over [a, b). */
  production(a: number, b: number): void;
  /** Open time (conditions 1–3) in [a, b) spent waiting on a weather gate. */
  weatherWait(a: number, b: number): void;
  /** A calendar gap [a, b) between production segments of one packet. */
  gap(a: number, b: number): void;
  /** Set by `produce` / `pour`: the production start of the last packet. */
  lastStart: number;
}

interface Open {
  starts: Float64Array;
  ends: Float64Array;
  length: number;
}

const EPS = 1e-9;

/**
 * Non-continuous production of `hours` from `from`, over the open intervals `iv` starting at index `i`,
 * in slots passing `profile` (all of them when profile < 0). Returns the finish, or Infinity past the horizon.
 */
export function produce(iv: Open, i: number, gates: GateCache, profile: number, from: number, hours: number, sink: WorkSink): number {
  let rem = hours;
  let started = false;
  let lastEnd = from;
  sink.lastStart = Infinity;
  for (; i < iv.length; i++) {
    let t = iv.starts[i] > from ? iv.starts[i] : from;
    const b = iv.ends[i];
    if (started && t > lastEnd) sink.gap(lastEnd, t);
    if (profile < 0) {
      if (!started) sink.lastStart = t;
      started = true;
      if (b - t >= rem - EPS) {
        sink.production(t, t + rem);
        return t + rem;
      }
      sink.production(t, b);
      rem -= b - t;
      lastEnd = b;
      continue;
    }
    while (t < b) {
      const k = Math.floor(t);
      if (gates.slotOk(profile, k)) {
        const runStart = t;
        if (!started) sink.lastStart = t;
        started = true;
        for (;;) {
          const slotEnd = Math.min(Math.floor(t) + 1, b);
          if (slotEnd - t >= rem - EPS) {
            sink.production(runStart, t + rem);
            return t + rem;
          }
          rem -= slotEnd - t;
          t = slotEnd;
          if (t >= b || !gates.slotOk(profile, t)) break;
        }
        sink.production(runStart, t);
        lastEnd = t;
      } else {
        const failStart = t;
        t = Math.min(k + 1, b);
        while (t < b && !gates.slotOk(profile, t)) t = Math.min(t + 1, b);
        sink.weatherWait(failStart, t);
        lastEnd = t;
      }
    }
  }
  return Infinity;
}

/**
 * A continuous packet of `hours`: the earliest candidate start t ≥ `from` (an interval start or a whole hour
 * inside it) with [t, t + hours] inside one open interval, every slot passing `profile`, the first slot rising
 * when `risingFirst`, and no rain in the `noRainAfter` hours after the finish. Returns the finish or Infinity.
 */
export function pour(
  iv: Open, i: number, gates: GateCache, profile: number, risingFirst: boolean, noRainAfter: number,
  from: number, hours: number, sink: WorkSink,
): number {
  // Not started yet: waits before the pour begins are waits for the packet, not pauses inside it.
  sink.lastStart = Infinity;
  for (; i < iv.length; i++) {
    const a = iv.starts[i];
    const b = iv.ends[i];
    if (b - a < hours - EPS) continue;
    let t = a >= from ? a : Math.ceil(from);
    while (t + hours <= b + EPS) {
      const k0 = Math.floor(t);
      if (risingFirst && !isRisingSlot(k0)) {
        const h = k0 - 24 * Math.floor(k0 / 24);
        t = k0 - h + (h < 6 ? 6 : 30);
        continue;
      }
      let next = -1;
      if (profile >= 0) {
        // Latest slot first: every candidate up to a failing slot f contains f, so the next candidate worth
        // trying is f + 1, and the latest failure skips furthest (hot afternoons fail late slots first).
        for (let k = Math.ceil(t + hours - EPS) - 1; k >= k0; k--) {
          if (!gates.slotOk(profile, k)) {
            next = k + 1;
            break;
          }
        }
      }
      if (next < 0 && noRainAfter > 0) {
        const f = t + hours;
        const rEnd = Math.ceil(f + noRainAfter - EPS);
        for (let r = Math.floor(f + EPS); r < rEnd; r++) {
          if (gates.rainAt(r)) {
            next = Math.max(k0 + 1, Math.ceil(r + 1 - hours - EPS));
            break;
          }
        }
      }
      if (next < 0) {
        sink.lastStart = t;
        sink.production(t, t + hours);
        return t + hours;
      }
      sink.weatherWait(t, Math.min(next, b));
      t = next;
    }
  }
  sink.lastStart = Infinity;
  return Infinity;
}
