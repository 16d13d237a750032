/**
 * Seeded randomness for the engine. Contract: `createRng(seed)` gives a reproducible uniform stream in [0, 1)
 * (seedrandom's Alea: fast, 32-bit resolution, identical in every JavaScript runtime); `normal` and `gamma`
 * turn that stream into standard normal and gamma variates. No sampler keeps hidden state (no cached
 * Box–Muller spare), so the number of uniforms a draw consumes depends only on the draw itself and a stream
 * stays easy to reason about when code paths change.
 */
import seedrandom from "seedrandom";

export interface Rng {
  /** Uniform on [0, 1). */
  next(): number;
}

export function createRng(seed: string): Rng {
  const prng = seedrandom.alea(seed);
  return { next: prng };
}

const TWO_PI = 2 * Math.PI;

/** Standard normal by Box–Muller (cosine branch only; two uniforms per draw). */
export function normal(rng: Rng): number {
  // 1 − u lies in (0, 1], so the logarithm is finite.
  const u1 = 1 - rng.next();
  const u2 = rng.next();
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(TWO_PI * u2);
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
  const c = 1 / Math.sqrt(9 * d);
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
