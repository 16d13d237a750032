/**
 * How a run of N iterations is split over a pool. Iteration k always draws from the stream "seed:k", so any
 * split gives the same per-iteration results; merging the parts in index order gives the single-worker run.
 */
export interface IterationRange {
  from: number;
  to: number; // exclusive
}

export function splitIterations(iterations: number, workers: number): IterationRange[] {
  const n = Math.max(1, Math.min(Math.floor(workers), iterations));
  const out: IterationRange[] = [];
  const base = Math.floor(iterations / n);
  let extra = iterations % n;
  let from = 0;
  for (let i = 0; i < n; i++) {
    const size = base + (extra > 0 ? 1 : 0);
    if (extra > 0) extra--;
    out.push({ from, to: from + size });
    from += size;
  }
  return out.filter((r) => r.to > r.from);
}

/** A worker count for this device: all cores but one for the page, at least one, at most eight. */
export function poolSize(hardwareConcurrency: number | undefined): number {
  const cores = hardwareConcurrency && hardwareConcurrency > 0 ? hardwareConcurrency : 2;
  return Math.max(1, Math.min(8, cores - 1 || 1));
}
