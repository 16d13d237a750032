/**
 * `npm run bench -- --browser [--json] [--rounds N]`: the run path as a person meets it, in Debian's Chromium.
 * It starts a throwaway app as the API bench does (`startThrowawayApp` of scripts/pourline.mjs: the set-up of
 * `npm test` — fresh PostgreSQL cluster, seeded demo, the built app on free ports — without the engine worker,
 * so a saved run's verification waits in the queue instead of taking a core from the browser); all of it is
 * stopped and removed when the benchmark ends, however it ends.
 *
 * Beside the app it signs in as the demo scheduler, opens the main demo scenario (Kestrel Bay Causeway — two
 * seasons), and for 1, 2 and 4 engine workers (those navigator.hardwareConcurrency allows; `?workers=N` sets
 * the pool) runs 10,000 iterations `--rounds` times (3 by default), each on a fresh load of the page and a new
 * seed, and reports the median of: milliseconds from the click to the chart drawn, the engine's time (the
 * slowest worker's time inside the engine), the rest (start-up, messages, summary, save, drawing) and the
 * longest main-thread task from the click until the page has settled after the save. Then one run of 20,000
 * iterations with the pool the page chooses itself: the longest task while its result is drawn (from the
 * summary reaching the page until the page has settled). Definitions of click, drawn and long task:
 * scripts/bench-browser-page.ts. Wall-clock figures: a machine busy with other work measures slower.
 */
import { loadavg } from "node:os";
import type { Browser, Page } from "playwright-core";
import { poolSize } from "../workers/ranges";
import { failureMessage, logToStderr, shutdown, startThrowawayApp } from "./pourline.mjs";
import { armWatch, idle, untilPoolReady, UNTIL_DRAWN, UNTIL_SETTLED, WHAT_IS_DRAWN, LONG_TASK_RECORDER, READ_FIGURES, type PageFigures } from "./bench-browser-page";

const ITERATIONS = 10_000;
const DRAWING_ITERATIONS = 20_000;
const WORKER_COUNTS = [1, 2, 4];
const TARGETS = { clickToChartMs: 1_200, longestTaskMs: 100 };

interface RoundFigures {
  workers: number;
  clickToChartMs: number;
  engineMs: number | null;
  /** Click to chart, less the engine: start-up, messages, summary, save and drawing. */
  overheadMs: number | null;
  /** Longest main-thread task from the click until the page settled (0: none of 50 ms or more). */
  longestTaskMs: number;
  /** Longest main-thread task from the summary's arrival until the page settled. */
  longestDrawingTaskMs: number;
  /** Click to chart in parts (they add up to it): see `parts` in figuresOf. */
  parts: { engineMs: number; toWorkersAndBackMs: number; summaryMs: number; drawMs: number } | null;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.floor((s.length - 1) / 2)] : NaN;
};
const ms = (x: number) => Math.round(x);

function within<T>(limitMs: number, what: string, p: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`${what} did not come within ${limitMs / 1000} s`)), limitMs)));
  return Promise.race([p, late]).finally(() => clearTimeout(timer));
}

async function mainScenarioId(): Promise<string> {
  const { call, kestrelProject, signInAs } = await import("../tests/helpers/app");
  const cookie = await signInAs("scheduler");
  const project = await kestrelProject(cookie);
  const list = await call(`/api/projects/${project.id}/scenarios`, { cookie });
  const main = list.body.scenarios.find((s: { name: string }) => /two seasons/i.test(s.name));
  if (!main) throw new Error("the seeded main demo scenario (two seasons) is missing");
  return main.id;
}

/** One run on a fresh load of the page: returns the figures of it. */
async function measureRun(page: Page, url: string, iterations: number, seed: string, log: (s: string) => void): Promise<PageFigures> {
  await page.goto(url);
  await page.getByTestId("start-run").waitFor();
  await page.waitForLoadState("networkidle");
  // The page starts and prepares its workers while a person reads it; a click comes after that.
  await page.evaluate(untilPoolReady(15_000));
  await page.evaluate(idle(2_000));
  await page.locator("#run-iterations").selectOption(String(iterations));
  await page.locator("#run-seed").fill(seed);
  await page.evaluate(armWatch(seed));
  await page.getByTestId("start-run").click();
  await within(300_000, `the charts of the run with seed ${seed}`, page.evaluate(UNTIL_DRAWN)).catch(async (e) => {
    throw new Error(`${e.message} (${await page.evaluate(WHAT_IS_DRAWN)})`);
  });
  // Settled (bench-browser-page.ts), and the main thread has been idle once since.
  await within(60_000, `the save of the run with seed ${seed}`, page.evaluate(UNTIL_SETTLED));
  await page.evaluate(idle(2_000));
  await page.waitForTimeout(300);
  const f = (await page.evaluate(READ_FIGURES)) as PageFigures;
  if (f.longTasks === null) throw new Error("this Chromium does not report long tasks (PerformanceObserver 'longtask')");
  log(`  ${iterations.toLocaleString("en-US")} iterations, seed ${seed}: click to chart ${ms(f.drawnAt - f.clickAt)} ms`);
  return f;
}

function figuresOf(workers: number, f: PageFigures): RoundFigures {
  const longest = (from: number) => Math.max(0, ...f.longTasks!.filter((t) => t.start + t.duration >= from && t.start <= f.now).map((t) => t.duration));
  const engineMs = f.engine.length ? Math.max(...f.engine.map((e) => e.engineMs)) : null;
  const clickToChartMs = f.drawnAt - f.clickAt;
  // engine: the slowest worker inside the engine; to workers and back: the rest until every range is back
  // (click handling, messages, a compile the warm pool did not save, the transfer of the results); summary:
  // merging and summarising in a worker and the summary's way back; draw: summary to the charts drawn.
  const parts =
    engineMs !== null && f.rangesDoneAt !== null && f.summaryAt !== null
      ? { engineMs: ms(engineMs), toWorkersAndBackMs: ms(f.rangesDoneAt - f.clickAt - engineMs), summaryMs: ms(f.summaryAt - f.rangesDoneAt), drawMs: ms(f.drawnAt - f.summaryAt) }
      : null;
  return {
    parts,
    workers,
    clickToChartMs: ms(clickToChartMs),
    engineMs: engineMs === null ? null : ms(engineMs),
    overheadMs: engineMs === null ? null : ms(clickToChartMs - engineMs),
    longestTaskMs: ms(longest(f.clickAt)),
    longestDrawingTaskMs: ms(longest(f.summaryAt ?? f.clickAt)),
  };
}

async function measure(browser: Browser, rounds: number, log: (s: string) => void) {
  const { signedIn } = await import("../tests/e2e/pages/sign-in");
  const { APP_URL } = await import("../tests/helpers/app");
  const scenarioId = await mainScenarioId();
  const { context, page } = await signedIn(browser, "scheduler", 1280);
  await context.addInitScript(LONG_TASK_RECORDER);
  const base = `${APP_URL}/scenarios/${scenarioId}`;
  const cores = (await page.evaluate("navigator.hardwareConcurrency")) as number;
  const counts = WORKER_COUNTS.filter((n) => n <= cores);
  // One run first, not counted: the app's server and the browser's caches warm up as they would for a person.
  log("warm-up run (not counted) …");
  await measureRun(page, base, 1_000, "bench-warm-up", log);
  const runs = [];
  for (const workers of counts) {
    log(`${workers} worker(s), ${rounds} round(s) of ${ITERATIONS.toLocaleString("en-US")} iterations …`);
    const all: RoundFigures[] = [];
    for (let r = 0; r < rounds; r++) all.push(figuresOf(workers, await measureRun(page, `${base}?workers=${workers}`, ITERATIONS, `bench-${workers}w-${r}`, log)));
    const pick = (k: keyof RoundFigures) => {
      const xs = all.map((a) => a[k]).filter((x): x is number => typeof x === "number");
      return xs.length ? median(xs) : null;
    };
    const part = (k: keyof NonNullable<RoundFigures["parts"]>) => median(all.flatMap((a) => (a.parts ? [a.parts[k]] : [])));
    runs.push({
      workers,
      clickToChartMs: pick("clickToChartMs")!,
      engineMs: pick("engineMs"),
      overheadMs: pick("overheadMs"),
      longestTaskMs: pick("longestTaskMs")!,
      // Medians of each part over the rounds (so they need not add up exactly to the median total).
      overheadParts: { toWorkersAndBackMs: part("toWorkersAndBackMs"), summaryMs: part("summaryMs"), drawMs: part("drawMs") },
      rounds: all.map((a) => a.clickToChartMs),
    });
  }
  const chosen = poolSize(cores);
  log(`${DRAWING_ITERATIONS.toLocaleString("en-US")} iterations with the page's own pool (${chosen} worker(s)) …`);
  const big = figuresOf(chosen, await measureRun(page, base, DRAWING_ITERATIONS, "bench-20k", log));
  await context.close();
  return { cores, chosen, runs, big };
}

/** Starts the throwaway app, measures beside it, then stops and removes it all (exits the process). */
export async function benchBrowser(args: string[]): Promise<never> {
  if (args.includes("--json")) logToStderr();
  try {
    const { env } = await startThrowawayApp({ chromium: true, worker: false, quietApp: true });
    // The page objects and helpers shared with the e2e tests read the app's address from the environment.
    Object.assign(process.env, env);
    return await shutdown(await measureAndReport(args));
  } catch (e) {
    process.stderr.write(`[bench] ${failureMessage(e)}\n`);
    return await shutdown(1);
  }
}

async function measureAndReport(args: string[]): Promise<number> {
  const json = args.includes("--json");
  const roundsAt = args.indexOf("--rounds");
  const rounds = roundsAt >= 0 ? Math.max(1, Number(args[roundsAt + 1]) || 1) : 3;
  const log = (s: string) => process.stderr.write(`${s}\n`);
  const loadBefore = loadavg();
  const { launch } = await import("../tests/helpers/browser");
  const browser = await launch();
  let result;
  try {
    result = await measure(browser, rounds, log);
  } finally {
    await browser.close();
  }
  const { cores, chosen, runs, big } = result;
  const headline = runs.find((r) => r.workers === chosen) ?? runs[0];
  const out = {
    browser: {
      iterations: ITERATIONS,
      workers: headline.workers,
      clickToChartMs: headline.clickToChartMs,
      longestTaskMs: headline.longestTaskMs,
      engineMs: headline.engineMs,
      overheadMs: headline.overheadMs,
      overheadParts: headline.overheadParts,
      engineShare: headline.engineMs === null ? null : Math.round((headline.engineMs / headline.clickToChartMs) * 100) / 100,
      runs,
      drawing: { iterations: DRAWING_ITERATIONS, workers: chosen, clickToChartMs: big.clickToChartMs, longestTaskWhileDrawnMs: big.longestDrawingTaskMs, longestTaskMs: big.longestTaskMs },
      hardwareConcurrency: cores,
      loadAverage: { before: loadBefore.map((x) => Math.round(x * 100) / 100), after: loadavg().map((x) => Math.round(x * 100) / 100) },
    },
  };
  if (json) {
    console.log(JSON.stringify(out, null, 2));
    return 0;
  }
  const b = out.browser;
  console.log(`load average before ${b.loadAverage.before.join(" ")}, after ${b.loadAverage.after.join(" ")}; ${cores} cores seen by the browser`);
  for (const r of runs)
    console.log(
      `${r.workers} worker(s): click to chart ${r.clickToChartMs} ms (rounds ${r.rounds.join(", ")})` +
        (r.engineMs === null ? "" : ` = engine ${r.engineMs} ms + the rest ${r.overheadMs} ms (to the workers and back ${r.overheadParts.toWorkersAndBackMs}, summary ${r.overheadParts.summaryMs}, drawing ${r.overheadParts.drawMs})`) +
        `; longest main-thread task ${r.longestTaskMs} ms`,
    );
  console.log(`page's own pool: ${b.workers} worker(s), click to chart ${b.clickToChartMs} ms (target ≤ ${TARGETS.clickToChartMs})${b.engineShare === null ? "" : `, engine share ${Math.round(b.engineShare * 100)} %`}`);
  console.log(`${DRAWING_ITERATIONS.toLocaleString("en-US")} iterations: click to chart ${big.clickToChartMs} ms; longest task while the result is drawn ${big.longestDrawingTaskMs} ms (target ≤ ${TARGETS.longestTaskMs}; 0 = none of 50 ms or more)`);
  return 0;
}
