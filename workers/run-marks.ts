/**
 * Names of the performance marks the browser run path leaves on the page's timeline (User Timing), so a
 * profile or the browser benchmark (`npm run bench -- --browser`) can split click-to-chart into its parts.
 * Plain strings, shared by the page and the benchmark.
 */
export const RUN_MARKS = {
  /** Every worker of the page's pool has started and compiled the scenario (before any click). */
  poolReady: "pourline:pool:ready",
  /** The run button was pressed (the pool is asked to start). */
  click: "pourline:run:click",
  /** Every worker has returned its range of iterations. */
  rangesDone: "pourline:run:ranges-done",
  /** The summary is back on the page's thread. */
  summary: "pourline:run:summary",
  /** The run's results view has been committed with the new summary (React's commit; the browser paints after). */
  drawn: "pourline:run:drawn",
  /** The save request answered. */
  saved: "pourline:run:saved",
} as const;

/** A measure per worker: `detail` says which worker and how long it spent inside the engine. */
export const ENGINE_MEASURE = "pourline:run:engine";

/** `performance.mark` where User Timing exists (not in every test runner); never throws. */
export function mark(name: string, detail?: unknown): void {
  try {
    globalThis.performance?.mark?.(name, detail === undefined ? undefined : { detail });
  } catch {
    // A timeline entry is a diagnostic; a browser without it runs the same.
  }
}

/** One worker's range on the timeline: from when it was asked to when it answered, with its engine time. */
export function measureEngine(start: number, detail: { worker: number; engineMs: number; compileMs: number }): void {
  try {
    globalThis.performance?.measure?.(ENGINE_MEASURE, { start, end: globalThis.performance.now(), detail });
  } catch {
    // As for mark(): diagnostics only.
  }
}
