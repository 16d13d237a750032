/**
 * Seeded randomness for the engine. Contract: `createRng(seed)` gives a reproducible uniform stream in [0, 1)
 * (seedrandom's Alea: fast, 32-bit resolution, identical in every JavaScript runtime; seeded and stepped here
 * with its arithmetic, checked against it); `normal` and `gamma`
 * turn that stream into standard normal and gamma variates. No sampler keeps hidden state (no cached
 * spare variate), so a draw depends only on the uniforms it consumes and a stream stays easy to reason
 * about when code paths change.
 */

export interface Rng {
  /** Uniform on [0, 1). */
  next(): number;
}

/**
 * Alea (J. Baagøe) with its four state words in a Float64Array, seeded and stepped with seedrandom's very
 * arithmetic, so the stream is the same bit for bit (tests/unit/random.test.ts compares them for any seed).
 * Why not call seedrandom's function: every generator it makes is a few fresh closures and objects (its Mash,
 * the generator, a state copy) — about a microsecond each, and an iteration makes three — and its state lives
 * in object fields, so each uniform pays boxed number stores and a call V8 cannot inline; here one class and
 * unboxed typed-array slots keep the hot loops (weather, samples) tight.
 */
export class AleaRng implements Rng {
  /** s0, s1, s2, c: hot loops may step the generator on locals and store the state back (./weather-draw). */
  readonly st = new Float64Array(4);
  constructor(seed: string) {
    // seedrandom's Alea(seed): Mash over " " three times gives s0, s1, s2; each then loses Mash(seed), mod 1.
    let n = 0xefc8249d;
    n = mash(n, " ");
    let s0 = mashFraction(n);
    n = mash(n, " ");
    let s1 = mashFraction(n);
    n = mash(n, " ");
    let s2 = mashFraction(n);
    n = mash(n, seed);
    s0 -= mashFraction(n);
    if (s0 < 0) s0 += 1;
    n = mash(n, seed);
    s1 -= mashFraction(n);
    if (s1 < 0) s1 += 1;
    n = mash(n, seed);
    s2 -= mashFraction(n);
    if (s2 < 0) s2 += 1;
    this.st[0] = s0;
    this.st[1] = s1;
    this.st[2] = s2;
    this.st[3] = 1;
  }
  next(): number {
    const st = this.st;
    const t = 2091639 * st[0] + st[3] * 2.3283064365386963e-10; // 2^-32
    st[0] = st[1];
    st[1] = st[2];
    const c = t | 0;
    st[3] = c;
    return (st[2] = t - c);
  }
}

/** Baagøe's Mash, as seedrandom writes it: the hash state `n` after feeding it `data`'s UTF-16 code units. */
function mash(n: number, data: string): number {
  for (let i = 0; i < data.length; i++) {
    n += data.charCodeAt(i);
    let h = 0.02519603282416938 * n;
    n = h >>> 0;
    h -= n;
    h *= n;
    n = h >>> 0;
    h -= n;
    n += h * 0x100000000; // 2^32
  }
  return n;
}

/** What Mash returns for a state: its low 32 bits as a fraction of 2^32. */
function mashFraction(n: number): number {
  return (n >>> 0) * 2.3283064365386963e-10; // 2^-32
}

export function createRng(seed: string): AleaRng {
  return new AleaRng(seed);
}

/*
 * Standard normal by the ziggurat method with 128 layers, in the form that draws the layer and the
 * position from separate uniforms (so they are independent even with a 32-bit generator).
 * Source: G. Marsaglia and W. W. Tsang (2000), "The Ziggurat Method for Generating Random Variables",
 * Journal of Statistical Software 5(8); J. A. Doornik (2005), "An Improved Ziggurat Method to Generate
 * Normal Random Samples" (ZIGNOR: R = 3.442619855899, V = 9.91256303526217e-3).
 * About 99 % of draws cost two uniforms and one multiply; the rest use exp/log. No state is kept between
 * draws, so a draw depends only on the uniforms it consumes.
 */
export const ZIG_LAYERS = 128;
const ZIG_R = 3.442619855899;
const ZIG_V = 9.91256303526217e-3;
/** Layer edges x_i and the ratios x_{i+1}/x_i (read by the inlined ziggurat of ./weather-draw). */
export const zigX = new Float64Array(ZIG_LAYERS + 1);
export const zigRatio = new Float64Array(ZIG_LAYERS);
{
  const f = Math.exp(-0.5 * ZIG_R * ZIG_R);
  zigX[0] = ZIG_V / f; // the base strip (rectangle plus tail) has the same area V as every layer
  zigX[1] = ZIG_R;
  zigX[ZIG_LAYERS] = 0;
  for (let i = 2; i < ZIG_LAYERS; i++) {
    const prev = zigX[i - 1];
    zigX[i] = Math.sqrt(-2 * Math.log(ZIG_V / prev + Math.exp(-0.5 * prev * prev)));
  }
  for (let i = 0; i < ZIG_LAYERS; i++) zigRatio[i] = zigX[i + 1] / zigX[i];
}

export function normal(rng: Rng): number {
  const u = 2 * rng.next() - 1;
  const i = (rng.next() * ZIG_LAYERS) | 0;
  if (Math.abs(u) < zigRatio[i]) return u * zigX[i]; // inside the layer's rectangle
  return normalEdge(rng, u, i);
}

/**
 * The ~1 % of ziggurat draws outside the layer's rectangle (tail or wedge), and the retries after a
 * rejection. Kept apart from `normal` so that its common path is small enough for V8 to inline into the hot
 * loops; the uniforms consumed, and so every draw, are the same as one loop doing both.
 */
export function normalEdge(rng: Rng, u: number, i: number): number {
  for (;;) {
    if (i === 0) {
      // Tail beyond R (Marsaglia 1964): x = −ln(U₁)/R, accept when −2 ln(U₂) > x².
      let x: number;
      let y: number;
      do {
        x = -Math.log(1 - rng.next()) / ZIG_R;
        y = -Math.log(1 - rng.next());
      } while (2 * y < x * x);
      return u < 0 ? -(ZIG_R + x) : ZIG_R + x;
    }
    const x = u * zigX[i];
    const f0 = Math.exp(-0.5 * (zigX[i] * zigX[i] - x * x));
    const f1 = Math.exp(-0.5 * (zigX[i + 1] * zigX[i + 1] - x * x));
    if (f1 + rng.next() * (f0 - f1) < 1) return x; // under the density in the layer's wedge
    u = 2 * rng.next() - 1;
    i = (rng.next() * ZIG_LAYERS) | 0;
    if (Math.abs(u) < zigRatio[i]) return u * zigX[i];
  }
}

/**
 * Gamma(shape k, scale θ), mean kθ, variance kθ².
 * Source: G. Marsaglia and W. W. Tsang (2000), "A simple method for generating gamma variables",
 * ACM Transactions on Mathematical Software 26(3), 363–372 — squeeze-and-reject on (1 + cZ)³ for k ≥ 1,
 * and the boost Gamma(k) = Gamma(k + 1) · U^{1/k} for k < 1 (same paper, section 6).
 */
export function gamma(rng: Rng, shape: number, scale: number): number {
  if (!(shape > 0) || !(scale > 0)) {
    if (shape === 0 || scale === 0) return 0;
    throw new RangeError(`gamma needs shape > 0 and scale > 0 (got ${shape}, ${scale})`);
  }
  if (shape < 1) {
    const u = 1 - rng.next();
    return gamma(rng, shape + 1, scale) * Math.pow(u, 1 / shape);
  }
  const d = shape - 1 / 3;
  return gammaCore(rng, d, 1 / Math.sqrt(9 * d), scale);
}

/**
 * Marsaglia–Tsang's loop for shape ≥ 1 given d = shape − 1/3 and c = 1/√(9d) (`gamma` above, for callers
 * that draw many variates of one shape and hoist the two constants; the same draws, bit for bit).
 */
export function gammaCore(rng: Rng, d: number, c: number, scale: number): number {
  for (;;) {
    let x: number;
    let v: number;
    do {
      x = normal(rng);
      v = 1 + c * x;
    } while (v <= 0);
    v = v * v * v;
    const u = 1 - rng.next();
    const x2 = x * x;
    if (u < 1 - 0.0331 * x2 * x2) return d * v * scale;
    if (Math.log(u) < 0.5 * x2 + d * (1 - v + Math.log(v))) return d * v * scale;
  }
}
