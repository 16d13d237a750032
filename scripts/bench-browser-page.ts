/**
 * What the browser benchmark runs inside the page, as plain JavaScript text (a function handed to
 * playwright's `evaluate` would be serialised after tsx's transform, which may add helpers the page lacks).
 *
 * Definitions (the figures `npm run bench -- --browser` prints):
 * - click: `performance.now()` in a capturing click listener on the run button — the first script that sees
 *   the press.
 * - chart drawn: the first moment when the results view of the new run (its `data-run-seed` is the seed the
 *   benchmark typed) holds the drawn shapes of all four of its charts, each chart's figure saying it draws
 *   that run (`data-drawn-seed`) — the confidence curve's line, the histogram's bars, the time–distance
 *   chart's lines and the delay chart's bars — and the browser has then
 *   rendered a frame: a MutationObserver notices the shapes, `requestAnimationFrame` waits for the next
 *   frame, and a message posted from it runs after that frame's paint; its `performance.now()` is "drawn".
 * - settled: the save has answered (the run panel's "saved" mark) and the page's refresh from the server
 *   shows the run (the results view of the seed, no longer marked as computed in this browser).
 * - long tasks: every `longtask` entry (the Long Tasks API reports main-thread tasks of 50 ms or more),
 *   observed with `buffered: true` from the first script of the page.
 */
import { ENGINE_MEASURE, RUN_MARKS } from "../workers/run-marks";

/** Installed before any page script (context.addInitScript): collects long tasks into `window.__benchLongTasks`. */
export const LONG_TASK_RECORDER = `
  window.__benchLongTasks = [];
  try {
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) window.__benchLongTasks.push({ start: e.startTime, duration: e.duration });
    }).observe({ type: "longtask", buffered: true });
  } catch (e) {
    window.__benchLongTasks = null;
  }
`;

/** One drawn shape of each chart of the results view (recharts' own class names), inside the chart's figure. */
const CHART_SHAPES = [
  ["[data-testid=confidence-curve]", ".recharts-line-curve"],
  ["[data-testid=finish-histogram]", ".recharts-bar-rectangle"],
  ["[data-testid=time-distance-chart] figure", ".recharts-line-curve"],
  ["[data-testid=delay-chart]", ".recharts-bar-rectangle"],
];

/** Arms the click and chart-drawn watch for one run; the seed names the run's results view. */
export function armWatch(seed: string): string {
  return `(() => {
    const seed = ${JSON.stringify(seed)};
    const shapes = ${JSON.stringify(CHART_SHAPES)};
    const state = (window.__benchRun = { seed, clickAt: null, drawnAt: null, seenAt: null });
    // Awaited by the benchmark (the page's CSP forbids the string evaluation a polling wait would use).
    state.drawn = new Promise((done) => (state.markDrawn = done));
    document.addEventListener("click", (e) => {
      if (state.clickAt === null && e.target instanceof Element && e.target.closest("[data-testid=start-run]")) state.clickAt = performance.now();
    }, { capture: true });
    const drawn = () => {
      const view = document.querySelector('[data-testid=results-view][data-run-seed="' + CSS.escape(seed) + '"]');
      if (!view) return false;
      // Each chart's figure says which run's summary it draws (data-drawn-seed): the old run's charts stay
      // on screen until the new summary reaches them, and must not count.
      return shapes.every(([figure, shape]) => view.querySelector(figure + '[data-drawn-seed="' + CSS.escape(seed) + '"] ' + shape));
    };
    const observer = new MutationObserver(() => {
      if (state.clickAt === null || state.seenAt !== null || !drawn()) return;
      state.seenAt = performance.now();
      observer.disconnect();
      requestAnimationFrame(() => {
        const ch = new MessageChannel();
        ch.port1.onmessage = () => {
          state.drawnAt = performance.now();
          state.markDrawn(true);
        };
        ch.port2.postMessage(null);
      });
    });
    observer.observe(document.body, { subtree: true, childList: true, attributes: true });
  })()`;
}

/** Resolves once the page's engine pool is warm (its "pool ready" mark), or after `ms` without it. */
export function untilPoolReady(ms: number): string {
  return `new Promise((done) => {
    const ready = () => performance.getEntriesByName(${JSON.stringify(RUN_MARKS.poolReady)}).length > 0;
    if (ready()) return done(true);
    const observer = new PerformanceObserver(() => ready() && (observer.disconnect(), done(true)));
    observer.observe({ type: "mark" });
    setTimeout(() => (observer.disconnect(), done(false)), ${ms});
  })`;
}

/** Resolves once the armed run's charts are drawn. */
export const UNTIL_DRAWN = "window.__benchRun.drawn.then(() => true)";

/** Resolves once the armed run is saved and the page shows the server's copy of it (see "settled" above). */
export const UNTIL_SETTLED = `new Promise((done) => {
  const s = window.__benchRun;
  const settled = () =>
    performance.getEntriesByName(${JSON.stringify(RUN_MARKS.saved)}).some((m) => m.startTime >= s.clickAt) &&
    !document.querySelector("[data-testid=local-run]") &&
    document.querySelector('[data-testid=results-view][data-run-seed="' + CSS.escape(s.seed) + '"]');
  if (settled()) return done(true);
  const check = () => {
    if (!settled()) return;
    clearInterval(timer);
    observer.disconnect();
    done(true);
  };
  const observer = new MutationObserver(check);
  observer.observe(document.body, { subtree: true, childList: true, attributes: true });
  const timer = setInterval(check, 250);
})`;

/** Which of the four charts show the armed run's shapes (for a message when they never all do). */
export const WHAT_IS_DRAWN = `(() => {
  const seed = window.__benchRun.seed;
  const view = document.querySelector('[data-testid=results-view][data-run-seed="' + CSS.escape(seed) + '"]');
  if (!view) return "no results view of the run";
  return ${JSON.stringify(CHART_SHAPES)}.map(([figure, shape]) => figure + ": " + (view.querySelector(figure + '[data-drawn-seed="' + CSS.escape(seed) + '"] ' + shape) ? "drawn" : view.querySelector(figure) ? "not this run's shapes" : "absent")).join("; ");
})()`;

/** Resolves once the page's main thread has had an idle period (or after `ms`). */
export function idle(ms: number): string {
  return `new Promise((done) => (window.requestIdleCallback ? requestIdleCallback(() => done(true), { timeout: ${ms} }) : setTimeout(() => done(true), ${ms})))`;
}

export interface PageFigures {
  clickAt: number;
  drawnAt: number;
  /** The summary reached the page (the end of the engine and summary, the start of drawing). */
  summaryAt: number | null;
  /** Every worker's range is back on the page. */
  rangesDoneAt: number | null;
  savedAt: number | null;
  /** Per worker: ms inside `runIterations` (the engine) and, when reported, ms to make the worker ready. */
  engine: { worker: number; engineMs: number; compileMs?: number }[];
  longTasks: { start: number; duration: number }[] | null;
  now: number;
}

/** Reads the figures of the armed run: the marks after the click, the engine measures, the long tasks. */
export const READ_FIGURES = `(() => {
  const s = window.__benchRun;
  const after = (name) => {
    const e = performance.getEntriesByName(name).filter((m) => m.startTime >= s.clickAt);
    return e.length ? e[e.length - 1].startTime : null;
  };
  const engine = performance.getEntriesByName(${JSON.stringify(ENGINE_MEASURE)})
    .filter((m) => m.startTime >= s.clickAt)
    .map((m) => ({ worker: m.detail?.worker ?? 0, engineMs: m.detail?.engineMs ?? m.duration, compileMs: m.detail?.compileMs }));
  return {
    clickAt: s.clickAt,
    drawnAt: s.drawnAt,
    summaryAt: after(${JSON.stringify(RUN_MARKS.summary)}),
    rangesDoneAt: after(${JSON.stringify(RUN_MARKS.rangesDone)}),
    savedAt: after(${JSON.stringify(RUN_MARKS.saved)}),
    engine,
    longTasks: window.__benchLongTasks,
    now: performance.now(),
  };
})()`;
