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

/**
 * A worker count for this device, at most eight. A run is what the person is waiting for, and the page's own
 * thread is nearly idle meanwhile (a progress line now and then, the charts after), so devices of up to four
 * cores use them all — on two cores that halves the wait (`npm run bench -- --browser`: 3.7–4.1 s with two
 * workers against 5.3–7.3 s with one) — and larger ones keep one core for the page and everything else.
 */
export function poolSize(hardwareConcurrency: number | undefined): number {
  const cores = hardwareConcurrency && hardwareConcurrency > 0 ? hardwareConcurrency : 2;
  return Math.max(1, Math.min(8, cores <= 4 ? cores : cores - 1));
}

/** The most workers a page may be asked for: more than the cores only slows each one down. */
export const MAX_POOL_SIZE = 8;

/**
 * A pool size asked for by hand: `?workers=N` in the page's address, else the `pourline.engineWorkers` key in
 * localStorage (kept for the browser). Used by the browser benchmark to compare 1, 2 and 4 workers, and by
 * anyone who wants to leave more of the machine free. A whole number 1–8, or null for "choose for this device".
 */
export function requestedPoolSize(fromAddress: string | null | undefined, fromStorage: string | null | undefined): number | null {
  for (const text of [fromAddress, fromStorage]) {
    if (text == null || text.trim() === "") continue;
    const n = Number(text);
    if (Number.isInteger(n) && n >= 1 && n <= MAX_POOL_SIZE) return n;
  }
  return null;
}
