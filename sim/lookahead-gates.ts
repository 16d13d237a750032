/**
 * The weather gates of MODEL.md "Weather", judged directly on hourly forecast values (not on the climate
 * generator). Contract: `HourlyValues` holds one value per whole hour `k` (hours since 00:00 of the board's
 * first day), `null` where the forecast says nothing. Each check returns the gate's verdict on one hour slot
 * `[k, k+1)`: `true` holds, `false` fails (with a sentence naming the value), `null` cannot be judged (a
 * value is missing). Rules, as MODEL.md states them for the engine:
 * - minTempF: T(k) ≥ min and T(k+1) ≥ min; maxTempF: T(k) ≤ max and T(k+1) ≤ max;
 * - rising: T(k+1) ≥ T(k) (judged from the temperature, not the clock);
 * - noRain: the slot is dry; maxWindMph: W(k) ≤ max; maxEvaporation: Uno (1998) with concrete at
 *   T(k) + concreteDeltaF, air T(k), RH(k) and W(k);
 * - after a pour's finish f: noRainHoursAfter (slots touching [f, f + n] dry) and protectAfter (slots touching
 *   [f, f + hours] with T ≥ minTempF at both ends).
 * Rain on the board: the forecast gives a probability of precipitation (PoP) per hour, not rain; an hour
 * counts as wet when PoP ≥ `rainPopPct` (default 50 %: "more likely than not"; a planning convention of
 * ours, no published source). Pure: no clock, no I/O.
 */
import { evaporationLbFt2h } from "./evaporation";

export interface HourlyValues {
  tempF: (number | null)[];
  popPct: (number | null)[];
  rhPct: (number | null)[];
  windMph: (number | null)[];
}

/** The gates a crew operation may carry (current and new MODEL.md "Weather" fields; absent = no gate). */
export interface GateSpec {
  minTempF?: number;
  maxTempF?: number;
  rising?: boolean;
  noRain?: boolean;
  noRainHoursAfter?: number;
  maxWindMph?: number;
  maxEvaporation?: number;
  concreteDeltaF?: number;
  protectAfter?: { minTempF: number; hours: number };
}

export type GateName = "minTemp" | "maxTemp" | "rising" | "noRain" | "maxWind" | "maxEvaporation" | "noRainAfter" | "protectAfter";

export const GATE_LABELS: Record<GateName, string> = {
  minTemp: "Minimum temperature",
  maxTemp: "Maximum temperature",
  rising: "Temperature rising",
  noRain: "No rain",
  maxWind: "Wind",
  maxEvaporation: "Evaporation",
  noRainAfter: "No rain after the pour",
  protectAfter: "Protection after the pour",
};

export const DEFAULT_RAIN_POP_PCT = 50;

export interface GateVerdict {
  gate: GateName;
  ok: boolean | null;
  /** Plain words: the value against the limit. */
  detail: string;
}

/** Does this operation carry any weather gate at all? */
export function isWeatherGated(g: GateSpec, continuous: boolean): boolean {
  return (
    g.minTempF !== undefined ||
    g.maxTempF !== undefined ||
    g.rising === true ||
    g.noRain === true ||
    g.maxWindMph !== undefined ||
    g.maxEvaporation !== undefined ||
    (continuous && ((g.noRainHoursAfter ?? 0) > 0 || g.protectAfter !== undefined))
  );
}

const at = (a: (number | null)[], k: number): number | null => (k >= 0 && k < a.length ? a[k] : null);
const f0 = (x: number) => `${Math.round(x)} °F`;

export class HourlyGates {
  constructor(
    private readonly v: HourlyValues,
    private readonly rainPopPct = DEFAULT_RAIN_POP_PCT,
  ) {}

  temp(k: number) {
    return at(this.v.tempF, k);
  }
  pop(k: number) {
    return at(this.v.popPct, k);
  }
  rh(k: number) {
    return at(this.v.rhPct, k);
  }
  wind(k: number) {
    return at(this.v.windMph, k);
  }

  /** Wet by the board's rule, or null when the hour has no probability of precipitation. */
  wet(k: number): boolean | null {
    const p = this.pop(k);
    return p === null ? null : p >= this.rainPopPct;
  }

  evaporation(k: number, concreteDeltaF: number): number | null {
    const t = this.temp(k);
    const rh = this.rh(k);
    const w = this.wind(k);
    if (t === null || rh === null || w === null) return null;
    return evaporationLbFt2h(t + concreteDeltaF, t, rh, w);
  }

  /** Per-slot gates (temperature limits, rain, wind, evaporation; rising when `withRising`). */
  slot(g: GateSpec, k: number, withRising: boolean): GateVerdict[] {
    const out: GateVerdict[] = [];
    const t0 = this.temp(k);
    const t1 = this.temp(k + 1);
    const both = t0 !== null && t1 !== null;
    if (g.minTempF !== undefined) {
      const lo = both ? Math.min(t0, t1) : null;
      out.push({ gate: "minTemp", ok: lo === null ? null : lo >= g.minTempF, detail: lo === null ? "no temperature forecast" : `${f0(lo)} against a minimum of ${f0(g.minTempF)}` });
    }
    if (g.maxTempF !== undefined) {
      const hi = both ? Math.max(t0, t1) : null;
      out.push({ gate: "maxTemp", ok: hi === null ? null : hi <= g.maxTempF, detail: hi === null ? "no temperature forecast" : `${f0(hi)} against a maximum of ${f0(g.maxTempF)}` });
    }
    if (withRising && g.rising === true) {
      out.push({ gate: "rising", ok: both ? t1 >= t0 : null, detail: both ? (t1 >= t0 ? `${f0(t0)} → ${f0(t1)}` : `falling, ${f0(t0)} → ${f0(t1)}`) : "no temperature forecast" });
    }
    if (g.noRain === true) out.push(this.dry(k, "noRain"));
    if (g.maxWindMph !== undefined) {
      const w = this.wind(k);
      out.push({ gate: "maxWind", ok: w === null ? null : w <= g.maxWindMph, detail: w === null ? "no wind forecast" : `${Math.round(w)} mph against a limit of ${g.maxWindMph} mph` });
    }
    if (g.maxEvaporation !== undefined) {
      const e = this.evaporation(k, g.concreteDeltaF ?? 0);
      out.push({
        gate: "maxEvaporation",
        ok: e === null ? null : e <= g.maxEvaporation,
        detail: e === null ? "no temperature, humidity or wind forecast" : `${e.toFixed(2)} lb/ft²/h against a limit of ${g.maxEvaporation}`,
      });
    }
    return out;
  }

  private dry(k: number, gate: "noRain" | "noRainAfter"): GateVerdict {
    const wet = this.wet(k);
    const p = this.pop(k);
    return { gate, ok: wet === null ? null : !wet, detail: p === null ? "no precipitation forecast" : `${Math.round(p)} % chance of rain${wet ? " (counts as rain)" : ""}` };
  }

  /** After-pour gates of a continuous packet finishing at `f`: one verdict per slot that fails or cannot be judged. */
  afterPour(g: GateSpec, f: number): { k: number; verdict: GateVerdict }[] {
    const out: { k: number; verdict: GateVerdict }[] = [];
    const n = g.noRainHoursAfter ?? 0;
    if (n > 0) for (let k = Math.floor(f); k < Math.ceil(f + n); k++) out.push({ k, verdict: this.dry(k, "noRainAfter") });
    const p = g.protectAfter;
    if (p && p.hours > 0) {
      for (let k = Math.floor(f); k < Math.ceil(f + p.hours); k++) {
        const t0 = this.temp(k);
        const t1 = this.temp(k + 1);
        const lo = t0 !== null && t1 !== null ? Math.min(t0, t1) : null;
        out.push({ k, verdict: { gate: "protectAfter", ok: lo === null ? null : lo >= p.minTempF, detail: lo === null ? "no temperature forecast" : `${f0(lo)} against ${f0(p.minTempF)} needed for ${p.hours} h after the pour` } });
      }
    }
    return out;
  }
}

/** Combines verdicts: false if any fails, else null if any cannot be judged, else true. */
export function allHold(vs: readonly { ok: boolean | null }[]): boolean | null {
  let unknown = false;
  for (const v of vs) {
    if (v.ok === false) return false;
    if (v.ok === null) unknown = true;
  }
  return unknown ? null : true;
}
