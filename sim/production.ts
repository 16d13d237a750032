/**
 * How work and waits advance through weather-gated time (MODEL.md, "Work" and "Weather"). Contract:
 * - `produce`: non-continuous production of `hours` over open intervals, in slots passing the gate profile;
 * - `pour`: the earliest candidate start of a continuous packet whose whole run is open and passes the
 *   gates, whose first slot rises when required, with no rain in the `noRainHoursAfter` hours after the
 *   finish and the air at or above the protection temperature for the `protectAfter` hours after it;
 * - `warmCureFinish`: a wait counted only in hour slots at or above a temperature ("Cure counted in warm
 *   hours").
 * Each returns the finish, or Infinity past the horizon; production and weather waits go to the `WorkSink`.
 */
import type { GateCache } from "./gates";

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
    // An instant within EPS below the interval's end is its end (MODEL.md, "hour slot"): nothing of the interval
    // is left, and a crew must not start a sliver of production in it (a start 10⁻¹⁴ h before a closing hour).
    if (b - t <= EPS) continue;
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
      // An instant within EPS below a whole hour is that hour (MODEL.md, "hour slot"): packet durations summed in
      // floating point (e.g. thirds of an hour) land a hair short of it, and must not start a sliver in the slot before.
      const k = Math.floor(t + EPS);
      if (gates.slotOk(profile, k)) {
        const runStart = t;
        if (!started) sink.lastStart = t;
        started = true;
        for (;;) {
          const slotEnd = Math.min(Math.floor(t + EPS) + 1, b);
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

/** What a continuous packet checks beyond its per-slot gate profile. */
export interface PourRules {
  profile: number; // gate profile index, -1 when none
  risingFirst: boolean;
  noRainAfter: number; // hours, 0 when none
  protectMinF: number;
  protectHours: number; // 0 when no protection window
}

/**
 * A continuous packet of `hours`: the earliest candidate start t ≥ `from` (an interval start or a whole hour
 * inside it) with [t, t + hours] inside one open interval, every slot passing the profile, the first slot
 * rising when `risingFirst`, no rain in the `noRainAfter` hours after the finish and every slot touching the
 * `protectHours` after it warm (both ends ≥ `protectMinF`). Returns the finish or Infinity.
 */
export function pour(iv: Open, i: number, gates: GateCache, rules: PourRules, from: number, hours: number, sink: WorkSink): number {
  const { profile, risingFirst, noRainAfter, protectMinF, protectHours } = rules;
  // Not started yet: waits before the pour begins are waits for the packet, not pauses inside it.
  sink.lastStart = Infinity;
  for (; i < iv.length; i++) {
    const a = iv.starts[i];
    const b = iv.ends[i];
    if (b - a < hours - EPS) continue;
    // A ready time within EPS after a candidate is that candidate (MODEL.md, "Continuous"): a sum of packet
    // durations lands a hair after the whole hour it means.
    let t = a >= from - EPS ? a : Math.ceil(from - EPS);
    while (t + hours <= b + EPS) {
      const k0 = Math.floor(t);
      if (risingFirst && !gates.rising(k0)) {
        // A falling first slot is not a weather wait (MODEL.md, weather-lost shifts exclude `rising`).
        t = gates.nextRisingFrom(k0);
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
      if (next < 0 && protectHours > 0) {
        // Latest cold slot first, as above: it skips furthest.
        const f = t + hours;
        const first = Math.floor(f + EPS);
        for (let r = Math.ceil(f + protectHours - EPS) - 1; r >= first; r--) {
          if (!gates.warmSlot(protectMinF, r)) {
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

/**
 * A wait of `hours` counted only in hour slots [k, k+1) with both ends at or above `aboveF`, from `ready`
 * (the part of a slot after `ready` counts). Whole days entirely warm or entirely cold are taken at once.
 * Returns the finish, or Infinity when the hours are not reached before `horizon`.
 */
export function warmCureFinish(gates: GateCache, aboveF: number, ready: number, hours: number, horizon: number): number {
  if (!(ready < horizon)) return Infinity;
  let rem = hours;
  if (rem <= 0) return ready;
  let t = ready;
  while (t < horizon) {
    const d = Math.floor(t / 24);
    const dayEnd = Math.min(24 * (d + 1), horizon);
    if (gates.dayLow(d) >= aboveF) {
      if (dayEnd - t >= rem - EPS) return t + rem;
      rem -= dayEnd - t;
      t = dayEnd;
      continue;
    }
    if (gates.dayHigh(d) < aboveF) {
      t = dayEnd;
      continue;
    }
    const k = Math.floor(t);
    const end = k + 1;
    if (gates.tempAt(k) >= aboveF && gates.tempAt(end) >= aboveF) {
      if (end - t >= rem - EPS) return t + rem;
      rem -= end - t;
    }
    t = end;
  }
  return Infinity;
}
