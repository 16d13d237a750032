/**
 * Nearest-rank percentiles (MODEL.md, "Monte Carlo"): the p-th percentile of n sorted values is the
 * ceil(p·n)-th smallest (1-based; p = 0 gives the smallest). Infinity (an unfinished iteration) sorts last
 * like any large value.
 */

/** An ascending copy (typed-array sort: numeric, Infinity last). */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  return Float64Array.from(values).sort();
}

export function nearestRank(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const rank = Math.max(1, Math.ceil(p * n - 1e-12));
  return sorted[Math.min(n, rank) - 1];
}

export interface Quantiles {
  p10: number;
  p50: number;
  p80: number;
  p90: number;
}

export function quantiles(values: ArrayLike<number>): Quantiles {
  const s = sortedCopy(values);
  return { p10: nearestRank(s, 0.1), p50: nearestRank(s, 0.5), p80: nearestRank(s, 0.8), p90: nearestRank(s, 0.9) };
}
