import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { distributionBounds, distributionMean, sampleDistribution } from "../../sim/distributions";
import { createRng } from "../../sim/random";
import type { Distribution } from "../../sim/schema";

/**
 * Sample mean, variance and fourth central moment. Tolerances below are 5 standard errors:
 * SE(mean) = σ/√n with the closed-form σ, and SE(variance) ≈ √((m₄ − s⁴)/n) with m₄ the sample fourth
 * central moment (the usual large-sample standard error of a sample variance).
 */
function sampleMoments(d: Distribution, seed: string, n: number) {
  const rng = createRng(seed);
  const xs = new Float64Array(n);
  let sum = 0;
  for (let i = 0; i < n; i++) sum += xs[i] = sampleDistribution(d, rng);
  const mean = sum / n;
  let m2 = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const e = (xs[i] - mean) ** 2;
    m2 += e;
    m4 += e * e;
  }
  m2 /= n;
  m4 /= n;
  return { mean, variance: m2, seVariance: Math.sqrt((m4 - m2 * m2) / n), xs };
}

const N = 100_000;

describe("triangular", () => {
  // Source: triangular distribution closed forms (e.g. NIST/SEMATECH e-Handbook; Evans, Hastings & Peacock,
  // "Statistical Distributions"): mean (a + b + c)/3, variance (a² + b² + c² − ab − ac − bc)/18.
  const cases: Array<[number, number, number]> = [
    [10, 20, 60],
    [0, 0, 1],
    [5, 9, 9],
  ];
  for (const [a, c, b] of cases) {
    it(`min ${a}, mode ${c}, max ${b}: mean and variance match the closed forms`, () => {
      const d: Distribution = { type: "triangular", min: a, mode: c, max: b };
      const mean = (a + b + c) / 3;
      const variance = (a * a + b * b + c * c - a * b - a * c - b * c) / 18;
      const s = sampleMoments(d, `tri-${a}-${c}-${b}`, N);
      expect(distributionMean(d)).toBeCloseTo(mean, 12);
      expect(Math.abs(s.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / N));
      expect(Math.abs(s.variance - variance)).toBeLessThan(5 * s.seVariance);
    });
  }

  it("P(X ≤ mode) = (mode − min)/(max − min)", () => {
    // Source: triangular CDF at the mode. n = 100,000, p = 0.2: SE = √(0.16/n) ≈ 0.00126; tolerance 5 SE.
    const d: Distribution = { type: "triangular", min: 10, mode: 20, max: 60 };
    const s = sampleMoments(d, "tri-cdf", N);
    const below = s.xs.reduce((k, x) => k + (x <= 20 ? 1 : 0), 0) / N;
    expect(Math.abs(below - 0.2)).toBeLessThan(5 * 0.00126);
  });
});

describe("PERT", () => {
  // Source: PERT mean (min + 4·mode + max)/6 (Malcolm, Roseboom, Clark & Fazar 1959, the PERT paper).
  // Variance computed from the beta variance αβ/((α+β)²(α+β+1))·(max − min)² with α + β = 6:
  // (μ − min)(max − μ)/7.
  const cases: Array<[number, number, number]> = [
    [100, 150, 300],
    [2, 2, 8],
    [40, 50, 60],
  ];
  for (const [a, m, b] of cases) {
    it(`min ${a}, mode ${m}, max ${b}: mean and variance match the closed forms`, () => {
      const d: Distribution = { type: "pert", min: a, mode: m, max: b };
      const mean = (a + 4 * m + b) / 6;
      const variance = ((mean - a) * (b - mean)) / 7;
      const s = sampleMoments(d, `pert-${a}-${m}-${b}`, N);
      expect(distributionMean(d)).toBeCloseTo(mean, 12);
      expect(Math.abs(s.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / N));
      expect(Math.abs(s.variance - variance)).toBeLessThan(5 * s.seVariance);
    });
  }
});

describe("lognormal", () => {
  // Source: lognormal closed forms — median e^μ, mean e^{μ + σ²/2}, ln X ~ N(μ, σ²); variance of X is
  // (e^{σ²} − 1)·e^{2μ + σ²}. n = 100,000, tolerance 5 SE with SE(mean) = sd(X)/√n.
  for (const [median, sigma] of [
    [24, 0.25],
    [3, 0.8],
  ] as Array<[number, number]>) {
    it(`median ${median}, σ ${sigma}: mean median·e^{σ²/2}, half the mass below the median`, () => {
      const d: Distribution = { type: "lognormal", median, sigma };
      const mean = median * Math.exp((sigma * sigma) / 2);
      const variance = (Math.exp(sigma * sigma) - 1) * median * median * Math.exp(sigma * sigma);
      const s = sampleMoments(d, `ln-${median}-${sigma}`, N);
      expect(distributionMean(d)).toBeCloseTo(mean, 12);
      expect(Math.abs(s.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / N));
      expect(Math.abs(s.variance - variance)).toBeLessThan(5 * s.seVariance);
      const below = s.xs.reduce((k, x) => k + (x < median ? 1 : 0), 0) / N;
      // SE of a proportion at p = 0.5: √(0.25/n) ≈ 0.00158.
      expect(Math.abs(below - 0.5)).toBeLessThan(5 * 0.00158);
    });
  }
});

const distributionArb: fc.Arbitrary<Distribution> = fc.oneof(
  fc.double({ min: 0, max: 1e4, noNaN: true }).map((value): Distribution => ({ type: "fixed", value })),
  fc
    .tuple(
      fc.constantFrom("triangular" as const, "pert" as const),
      fc.double({ min: 0, max: 1e4, noNaN: true }),
      fc.double({ min: 0, max: 1e4, noNaN: true }),
      fc.double({ min: 0, max: 1e4, noNaN: true }),
    )
    .map(([type, x, y, z]): Distribution => {
      const [min, mode, max] = [x, y, z].sort((p, q) => p - q);
      return { type, min, mode, max };
    }),
  fc
    .tuple(fc.double({ min: 0.01, max: 1e4, noNaN: true }), fc.double({ min: 0, max: 3, noNaN: true }))
    .map(([median, sigma]): Distribution => ({ type: "lognormal", median, sigma })),
);

describe("laws (properties)", () => {
  it("every sample lies within distributionBounds, and so does the mean", () => {
    fc.assert(
      fc.property(distributionArb, fc.string(), (d, seed) => {
        const { min, max } = distributionBounds(d);
        const rng = createRng(seed);
        for (let i = 0; i < 50; i++) {
          const x = sampleDistribution(d, rng);
          expect(Number.isFinite(x)).toBe(true);
          expect(x).toBeGreaterThanOrEqual(min);
          expect(x).toBeLessThanOrEqual(max);
        }
        // The closed-form mean is exact in real arithmetic; allow one part in 10¹² for floating rounding.
        const mean = distributionMean(d);
        const slack = 1e-12 * Math.max(1, Math.abs(mean));
        expect(mean).toBeGreaterThanOrEqual(min - slack);
        expect(mean).toBeLessThanOrEqual(max + slack);
      }),
    );
  });

  it("the same seed gives the same sequence of samples", () => {
    fc.assert(
      fc.property(distributionArb, fc.string(), (d, seed) => {
        const a = createRng(seed);
        const b = createRng(seed);
        for (let i = 0; i < 20; i++) expect(sampleDistribution(d, a)).toBe(sampleDistribution(d, b));
      }),
    );
  });

  it("fixed always returns its value and lognormal with σ = 0 its median", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e6, noNaN: true }), fc.string(), (v, seed) => {
        const rng = createRng(seed);
        expect(sampleDistribution({ type: "fixed", value: v }, rng)).toBe(v);
        expect(sampleDistribution({ type: "lognormal", median: v, sigma: 0 }, rng)).toBe(v);
      }),
    );
  });
});
