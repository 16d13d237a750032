/**
 * Sampling, means and bounds of the scenario's `Distribution` (see `./schema`). Contract:
 * - `sampleDistribution(d, rng)` draws one value using only `rng`; it allocates nothing.
 *   fixed → the value; triangular → inverse CDF (one uniform); pert → a beta on [min, max] with
 *   α = 1 + 4(mode − min)/(max − min), β = 1 + 4(max − mode)/(max − min), built from two gammas;
 *   lognormal → median · e^{σZ}.
 * - `distributionMean(d)` is the closed-form mean; `distributionBounds(d)` the support (lognormal: [0, ∞)).
 * A triangular or PERT with min = max is treated as fixed at that value.
 */
import type { Distribution } from "./schema";
import { gamma, normal, type Rng } from "./random";

export function sampleDistribution(d: Distribution, rng: Rng): number {
  switch (d.type) {
    case "fixed":
      return d.value;
    case "triangular": {
      const { min, mode, max } = d;
      const width = max - min;
      if (width <= 0) return min;
      const u = rng.next();
      const split = (mode - min) / width;
      const x = u < split ? min + Math.sqrt(u * width * (mode - min)) : max - Math.sqrt((1 - u) * width * (max - mode));
      return x < min ? min : x > max ? max : x; // rounding only
    }
    case "pert": {
      const { min, mode, max } = d;
      const width = max - min;
      if (width <= 0) return min;
      const alpha = 1 + (4 * (mode - min)) / width;
      const beta = 1 + (4 * (max - mode)) / width;
      const x = gamma(rng, alpha, 1);
      const y = gamma(rng, beta, 1);
      const v = min + (width * x) / (x + y);
      return v > max ? max : v; // rounding only
    }
    case "lognormal":
      return d.sigma === 0 ? d.median : d.median * Math.exp(d.sigma * normal(rng));
  }
}

export function distributionMean(d: Distribution): number {
  switch (d.type) {
    case "fixed":
      return d.value;
    case "triangular":
      return (d.min + d.mode + d.max) / 3;
    case "pert":
      return (d.min + 4 * d.mode + d.max) / 6;
    case "lognormal":
      return d.median * Math.exp((d.sigma * d.sigma) / 2);
  }
}

export function distributionBounds(d: Distribution): { min: number; max: number } {
  switch (d.type) {
    case "fixed":
      return { min: d.value, max: d.value };
    case "triangular":
    case "pert":
      return { min: d.min, max: d.max };
    case "lognormal":
      return { min: 0, max: Infinity };
  }
}
