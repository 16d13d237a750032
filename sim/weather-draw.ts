/**
 * The stochastic days of a weather series (./weather, MODEL.md "Weather"), drawn with the generator stepped on
 * local variables. Contract: `drawStochasticDays` writes days [from, to) exactly as the day loop the WGEN
 * description in ./weather gives — the same uniforms in the same order, so the same bits — and leaves the
 * generator, the chain state and the calendar position where the next day starts.
 * Why a loop of its own: a day takes eight or nine uniforms (wet state, two ziggurat normals, a gamma wind,
 * rain start and length), and stepping Alea through its typed-array state made each one a chain of stores and
 * reloads. Here its four words live in locals; the rare paths (the ziggurat's edge, the gamma's rejection)
 * store them back, call the shared samplers of ./random on the same generator, and reload.
 */
import { daysInMonth } from "./dates";
import { gammaCore, normalEdge, zigRatio, zigX, ZIG_LAYERS, type AleaRng } from "./random";

/** The per-month constants and the day-to-day constants of a stochastic series. */
export interface StochasticConstants {
  tmaxMean: Float64Array;
  tmaxSd: Float64Array;
  tminMean: Float64Array;
  tminSd: Float64Array;
  pWD: Float64Array;
  pWW: Float64Array;
  windScale: Float64Array;
  rh: Float64Array;
  rho: number;
  innov: number;
  wetMaxShift: number;
  wetMinShift: number;
  /** Truncated-geometric ratio of rain hours (0 → always 1 h, Infinity → always 24 h), its log and 1 − q²⁴. */
  q: number;
  lnQ: number;
  oneMinusQ24: number;
  /** Gamma wind: d = shape − 1/3 and c = 1/√(9d). */
  windD: number;
  windC: number;
}

/** A series' day columns, index = day since its start (read through the series: they are replaced when they grow). */
export interface DayColumns {
  tmaxF: Float64Array;
  tminF: Float64Array;
  windMph: Float64Array;
  rhPct: Float64Array;
  /** 1 on a wet day. */
  wet: Uint8Array;
  rainStartHour: Uint8Array;
  rainHours: Uint8Array;
}

const MAX_RAIN_HOURS = 24;
const TWO_POW_M32 = 2.3283064365386963e-10;

/**
 * Days [from, to) into `out`. `chain` = [previous day wet (0/1), χ of tmax, χ of tmin]; `cal` = [year,
 * month 0–11, day of month, month length] of day `from`. Both are updated to day `to`.
 */
export function drawStochasticDays(rng: AleaRng, k: StochasticConstants, chain: Float64Array, cal: Int32Array, out: DayColumns, from: number, to: number): void {
  const { tmaxMean, tmaxSd, tminMean, tminSd, pWD, pWW, windScale, rh, rho, innov, wetMaxShift, wetMinShift, q, lnQ, oneMinusQ24, windD, windC } = k;
  const { tmaxF, tminF, windMph, rhPct, wet: wetA, rainStartHour, rainHours } = out;
  const st = rng.st;
  let s0 = st[0];
  let s1 = st[1];
  let s2 = st[2];
  let c = st[3];
  let t = 0;
  let prevWet = chain[0] === 1;
  let chiMax = chain[1];
  let chiMin = chain[2];
  let year = cal[0];
  let month = cal[1];
  let dayOfMonth = cal[2];
  let monthLength = cal[3];
  for (let i = from; i < to; i++) {
    const mo = month;
    // One Alea step: t = 2091639·s0 + c·2⁻³²; (s0, s1, s2) ← (s1, s2, t − ⌊t⌋); c ← ⌊t⌋ — seedrandom's arithmetic.
    t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
    const wet = s2 < (prevWet ? pWW[mo] : pWD[mo]);
    prevWet = wet;

    // Two ziggurat normals (./random `normal`: a sign-and-position uniform, then a layer uniform).
    t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
    let u = 2 * s2 - 1;
    t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
    let layer = (s2 * ZIG_LAYERS) | 0;
    let z: number;
    if (Math.abs(u) < zigRatio[layer]) z = u * zigX[layer];
    else {
      st[0] = s0; st[1] = s1; st[2] = s2; st[3] = c;
      z = normalEdge(rng, u, layer);
      s0 = st[0]; s1 = st[1]; s2 = st[2]; c = st[3];
    }
    chiMax = rho * chiMax + innov * z;

    t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
    u = 2 * s2 - 1;
    t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
    layer = (s2 * ZIG_LAYERS) | 0;
    if (Math.abs(u) < zigRatio[layer]) z = u * zigX[layer];
    else {
      st[0] = s0; st[1] = s1; st[2] = s2; st[3] = c;
      z = normalEdge(rng, u, layer);
      s0 = st[0]; s1 = st[1]; s2 = st[2]; c = st[3];
    }
    chiMin = rho * chiMin + innov * z;

    const tmax = tmaxMean[mo] + (wet ? wetMaxShift : 0) + tmaxSd[mo] * chiMax;
    const tmin = tminMean[mo] + (wet ? wetMinShift : 0) + tminSd[mo] * chiMin;
    tmaxF[i] = tmax;
    tminF[i] = tmin > tmax - 1 ? tmax - 1 : tmin;

    // Wind: Marsaglia–Tsang (./random `gammaCore`), its first trial inline; anything else reruns the loop there.
    const scale = windScale[mo];
    if (scale > 0) {
      t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
      u = 2 * s2 - 1;
      t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
      layer = (s2 * ZIG_LAYERS) | 0;
      let w = -1;
      if (Math.abs(u) < zigRatio[layer]) {
        const x = u * zigX[layer];
        let v = 1 + windC * x;
        if (v > 0) {
          v = v * v * v;
          t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
          const g = 1 - s2;
          const x2 = x * x;
          if (g < 1 - 0.0331 * x2 * x2 || Math.log(g) < 0.5 * x2 + windD * (1 - v + Math.log(v))) w = windD * v * scale;
        }
      }
      if (w < 0) {
        // The ziggurat's edge of the first normal, a v ≤ 0 or a rejection: the loop's state is the generator
        // alone, so going on in gammaCore draws what the loop would have.
        st[0] = s0; st[1] = s1; st[2] = s2; st[3] = c;
        w = w === -1 && Math.abs(u) >= zigRatio[layer] ? gammaFromEdge(rng, u, layer, windD, windC, scale) : gammaCore(rng, windD, windC, scale);
        s0 = st[0]; s1 = st[1]; s2 = st[2]; c = st[3];
      }
      windMph[i] = w;
    } else windMph[i] = 0;

    const r = rh[mo] + (wet ? 10 : 0);
    rhPct[i] = r > 100 ? 100 : r;
    wetA[i] = wet ? 1 : 0;
    if (wet) {
      t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
      rainStartHour[i] = Math.floor(s2 * 24);
      // Rain duration by inversion of the truncated geometric: h = 1 + ⌊ln(1 − U(1 − q²⁴)) / ln q⌋.
      let h: number;
      if (q === 0) h = 1;
      else if (q === Infinity) h = MAX_RAIN_HOURS;
      else {
        t = 2091639 * s0 + c * TWO_POW_M32; s0 = s1; s1 = s2; c = t | 0; s2 = t - c;
        if (Math.abs(lnQ) < 1e-12) h = 1 + Math.floor(s2 * MAX_RAIN_HOURS);
        else {
          h = 1 + Math.floor(Math.log(1 - s2 * oneMinusQ24) / lnQ);
          h = h < 1 ? 1 : h > MAX_RAIN_HOURS ? MAX_RAIN_HOURS : h;
        }
      }
      rainHours[i] = h;
    } else {
      rainStartHour[i] = 0;
      rainHours[i] = 0;
    }

    if (++dayOfMonth > monthLength) {
      dayOfMonth = 1;
      if (++month === 12) {
        month = 0;
        year++;
      }
      monthLength = daysInMonth(year, month + 1);
    }
  }
  st[0] = s0; st[1] = s1; st[2] = s2; st[3] = c;
  chain[0] = prevWet ? 1 : 0;
  chain[1] = chiMax;
  chain[2] = chiMin;
  cal[0] = year;
  cal[1] = month;
  cal[2] = dayOfMonth;
  cal[3] = monthLength;
}

/**
 * The gamma draw when its first normal fell outside the ziggurat's rectangle: finish that normal on the
 * generator, then go on exactly as `gammaCore`'s loop would (its v ≤ 0 retry and its rejection restart).
 */
function gammaFromEdge(rng: AleaRng, u: number, layer: number, d: number, c: number, scale: number): number {
  const x = normalEdge(rng, u, layer);
  let v = 1 + c * x;
  if (!(v > 0)) return gammaCore(rng, d, c, scale);
  v = v * v * v;
  const g = 1 - rng.next();
  const x2 = x * x;
  if (g < 1 - 0.0331 * x2 * x2 || Math.log(g) < 0.5 * x2 + d * (1 - v + Math.log(v))) return d * v * scale;
  return gammaCore(rng, d, c, scale);
}
