import { describe, expect, it } from "vitest";
import fc from "fast-check";
import seedrandom from "seedrandom";
import { createRng, gamma, normal } from "../../sim/random";

function moments(draw: () => number, n: number) {
  let sum = 0;
  let sumSq = 0;
  for (let i = 0; i < n; i++) {
    const x = draw();
    sum += x;
    sumSq += x * x;
  }
  const mean = sum / n;
  return { mean, variance: sumSq / n - mean * mean };
}

describe("createRng", () => {
  it("is seedrandom's Alea stream bit for bit (the npm reference implementation), for any seed", () => {
    // Seeds of any UTF-16 code units (lone surrogates included) and long ones: Mash reads code units one by one.
    const seeds = fc.oneof(fc.string(), fc.string({ unit: "binary" }), fc.string({ unit: "binary", minLength: 100, maxLength: 400 }));
    fc.assert(
      fc.property(seeds, (seed) => {
        const ours = createRng(seed);
        const reference = seedrandom.alea(seed);
        for (let i = 0; i < 2000; i++) expect(ours.next()).toBe(reference());
      }),
      { numRuns: 100, examples: [[""], ["bench:0"], ["bench:0:w"], ["wx4294967295:0"]] },
    );
  });

  it("same seed gives the same sequence; different seeds differ (law, as a property)", () => {
    fc.assert(
      fc.property(fc.string(), fc.string(), (a, b) => {
        const r1 = createRng(a);
        const r2 = createRng(a);
        const r3 = createRng(b);
        let differs = false;
        for (let i = 0; i < 20; i++) {
          const x = r1.next();
          expect(r2.next()).toBe(x);
          if (r3.next() !== x) differs = true;
        }
        if (a !== b) expect(differs).toBe(true);
      }),
    );
  });

  it("draws lie in [0, 1)", () => {
    fc.assert(
      fc.property(fc.string(), (seed) => {
        const r = createRng(seed);
        for (let i = 0; i < 200; i++) {
          const x = r.next();
          expect(x).toBeGreaterThanOrEqual(0);
          expect(x).toBeLessThan(1);
        }
      }),
    );
  });

  it("is uniform: mean 1/2, variance 1/12, and ten equal bins pass a chi-square test", () => {
    // Source: standard statistics — U(0,1) has mean 1/2, variance 1/12. n = 200,000: SE(mean) =
    // √(1/12/n) ≈ 0.00065, tolerance 5 SE; SE(var) = √((1/80 − 1/144)/n) ≈ 0.00017, tolerance 5 SE.
    const n = 200_000;
    const r = createRng("uniform-check");
    const bins = new Array(10).fill(0);
    const m = moments(() => {
      const x = r.next();
      bins[Math.floor(x * 10)]++;
      return x;
    }, n);
    expect(Math.abs(m.mean - 0.5)).toBeLessThan(5 * 0.00065);
    expect(Math.abs(m.variance - 1 / 12)).toBeLessThan(5 * 0.00017);
    const expected = n / 10;
    const chi2 = bins.reduce((s, b) => s + ((b - expected) ** 2) / expected, 0);
    // Source: chi-square table, 9 degrees of freedom, 0.999 quantile = 27.88.
    expect(chi2).toBeLessThan(27.88);
  });
});

describe("normal", () => {
  it("has mean 0, variance 1 and 95 % of its mass within ±1.96", () => {
    // Source: standard normal closed forms. n = 200,000: SE(mean) = 1/√n ≈ 0.00224; SE(var) = √(2/n) ≈
    // 0.00316; SE(fraction inside ±1.96) = √(0.95·0.05/n) ≈ 0.00049. Tolerance 5 SE each.
    const n = 200_000;
    const r = createRng("normal-check");
    let inside = 0;
    const m = moments(() => {
      const z = normal(r);
      if (Math.abs(z) < 1.959964) inside++;
      return z;
    }, n);
    expect(Math.abs(m.mean)).toBeLessThan(5 * 0.00224);
    expect(Math.abs(m.variance - 1)).toBeLessThan(5 * 0.00316);
    expect(Math.abs(inside / n - 0.95)).toBeLessThan(5 * 0.00049);
  });

  it("matches the standard normal table in both tails (ziggurat layers, wedges and tail)", () => {
    // Source: standard normal table, Φ(z) for z = 0.5 … 3.5 (e.g. NIST/SEMATECH e-Handbook, Table 1.3.6.7.1).
    // n = 500,000; SE of a tail fraction √(p(1 − p)/n); tolerance 5 SE.
    const phi: Array<[number, number]> = [
      [0.5, 0.691462],
      [1, 0.841345],
      [1.5, 0.933193],
      [2, 0.97725],
      [2.5, 0.99379],
      [3, 0.99865],
      [3.5, 0.999767],
      [4, 0.9999683],
    ];
    const n = 500_000;
    const r = createRng("normal-table");
    const above = new Array(phi.length).fill(0);
    const below = new Array(phi.length).fill(0);
    for (let k = 0; k < n; k++) {
      const z = normal(r);
      for (let j = 0; j < phi.length; j++) {
        if (z > phi[j][0]) above[j]++;
        if (z < -phi[j][0]) below[j]++;
      }
    }
    phi.forEach(([, cdf], j) => {
      const p = 1 - cdf;
      const tol = 5 * Math.sqrt((p * (1 - p)) / n);
      expect(Math.abs(above[j] / n - p)).toBeLessThan(tol);
      expect(Math.abs(below[j] / n - p)).toBeLessThan(tol);
    });
  });

  it("keeps no state between draws: interleaving two streams changes nothing", () => {
    const alone = (seed: string) => {
      const r = createRng(seed);
      return Array.from({ length: 500 }, () => normal(r));
    };
    const a = createRng("a");
    const b = createRng("b");
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i < 500; i++) (xs.push(normal(a)), ys.push(normal(b)));
    expect(xs).toEqual(alone("a"));
    expect(ys).toEqual(alone("b"));
  });
});

describe("gamma (Marsaglia–Tsang)", () => {
  // Source: gamma closed forms — mean kθ, variance kθ², excess kurtosis 6/k, so the sample variance has
  // SE ≈ σ²·√((2 + 6/k)/n). n = 100,000 per case; tolerance 5 SE.
  const cases: Array<[number, number]> = [
    [4, 2.5],
    [1, 1],
    [0.5, 3],
    [10, 0.7],
  ];
  for (const [k, theta] of cases) {
    it(`shape ${k}, scale ${theta}: mean kθ and variance kθ²`, () => {
      const n = 100_000;
      const r = createRng(`gamma-${k}-${theta}`);
      const m = moments(() => gamma(r, k, theta), n);
      const mean = k * theta;
      const variance = k * theta * theta;
      expect(Math.abs(m.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / n));
      expect(Math.abs(m.variance - variance)).toBeLessThan(5 * variance * Math.sqrt((2 + 6 / k) / n));
    });
  }

  it("is positive for any shape and scale", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 50, noNaN: true }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        fc.string(),
        (k, theta, seed) => {
          const r = createRng(seed);
          for (let i = 0; i < 20; i++) expect(gamma(r, k, theta)).toBeGreaterThan(0);
        },
      ),
    );
  });

  it("rejects a negative shape", () => {
    expect(() => gamma(createRng("x"), -1, 1)).toThrow(RangeError);
  });
});
