/**
 * Evaporation rate from a fresh concrete surface, for the `maxEvaporation` weather gate.
 * Contract: pure functions of concrete temperature, air temperature, relative humidity (%) and wind speed
 * (measured about 0.5 m above the surface). Results are clamped at 0: a negative value means condensation,
 * i.e. no evaporation. The estimates are within about ±40 % of measured evaporation (Hover, ACI Materials
 * Journal 103(5), 2006), so they gate work, they do not predict cracking.
 * Source: P. J. Uno (1998), "Plastic Shrinkage Cracking and Evaporation Formulas", ACI Materials Journal
 * 95(4), 365–375; inch-pound form of the ACI 305R nomograph (ACI 305R, Fig. 2.1.5).
 */

/** 1 kg/m²/h in lb/ft²/h (0.45359237 kg/lb, 0.09290304 m²/ft²). */
export const KG_M2_H_TO_LB_FT2_H = 0.09290304 / 0.45359237;
/** ACI 305R: take precautions against plastic shrinkage above this rate (≈ 1.0 kg/m²/h). */
export const ACI305_PRECAUTION_LB_FT2_H = 0.2;
/** Latex-modified concrete overlays bleed little, so a tighter limit is advised. */
export const LMC_PRECAUTION_LB_FT2_H = 0.1;

const pos = (x: number) => (x > 0 ? x : 0);

/** Uno (1998): E = 5·[(Tc + 18)^2.5 − r·(Ta + 18)^2.5]·(V + 4)·10⁻⁶ kg/m²/h; °C, km/h. */
export function unoEvaporationKgM2h(concreteC: number, airC: number, rhPct: number, windKmh: number): number {
  const r = rhPct / 100;
  // x^2.5 as x·x·√x: several times cheaper than Math.pow on the gate's hot path; within 2 ulp of it (about
  // 4e-16 relative), far below the formula's ±40 % accuracy; a gate flips only at that distance from its limit.
  const tc = pos(concreteC + 18);
  const ta = pos(airC + 18);
  const e = 5 * (tc * tc * Math.sqrt(tc) - r * (ta * ta * Math.sqrt(ta))) * (pos(windKmh) + 4) * 1e-6;
  return pos(e);
}

/** Uno (1998) in inch-pound units: °F, mph in, lb/ft²/h out. */
export function evaporationLbFt2h(concreteF: number, airF: number, rhPct: number, windMph: number): number {
  const kg = unoEvaporationKgM2h(((concreteF - 32) * 5) / 9, ((airF - 32) * 5) / 9, rhPct, windMph * 1.609344);
  return kg * KG_M2_H_TO_LB_FT2_H;
}

/** ACI 305R nomograph, inch-pound form: E = (Tc^2.5 − r·Ta^2.5)(1 + 0.4 V)·10⁻⁶ lb/ft²/h; °F, mph. */
export function aci305EvaporationLbFt2h(concreteF: number, airF: number, rhPct: number, windMph: number): number {
  const r = rhPct / 100;
  const e = (Math.pow(pos(concreteF), 2.5) - r * Math.pow(pos(airF), 2.5)) * (1 + 0.4 * pos(windMph)) * 1e-6;
  return pos(e);
}
