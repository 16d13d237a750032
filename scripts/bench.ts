/**
 * Engine benchmark: `npm run bench [-- --json] [--iterations N]` (`-- --search`: the plan-search benchmark; `-- --api`:
 * the read API under load, scripts/bench-api.ts; `-- --browser`: click to chart in Chromium beside a throwaway app,
 * scripts/bench-browser.ts). One thread, the demo scenarios in
 * scenarios/. For each: iterations per second of `runIterations`, and the floor — the time to draw the same
 * samples alone (drawSamples plus the same days of weather the engine read) — so `floorRatio` = engine
 * time ÷ floor time says how much the engine costs beyond generating its inputs. Targets (brief): ≥ 5,000
 * iterations/s on the main demo and floorRatio ≤ 4. Each measurement is the best of five rounds after a
 * warm-up, timed in this process's CPU time (process.cpuUsage) so that other processes sharing the machine
 * do not count against the engine; wall-clock rates are printed beside it. The demo scenarios carry a
 * traffic section, so the engine time includes the per-iteration D/D/1 delay and costs; `delayP50VehHours`
 * is reported beside each rate, and `engineOnlyIterationsPerSecond` is the same run with traffic and costs
 * removed (what the queue model costs).
 */
import { readFileSync } from "node:fs";
import { compileScenario, parseScenario, runIterations } from "../sim/index";
import { drawSamples, type IterationSamples } from "../sim/samples";

const MAIN = "kestrel-two-season.json";
const FILES = [MAIN, "kestrel-single-season.json", "kestrel-holiday-work.json", "kestrel-two-placement-crews.json"];

const args = process.argv.slice(2);
const json = args.includes("--json");
const itIdx = args.indexOf("--iterations");
const iterations = itIdx >= 0 ? Number(args[itIdx + 1]) : 3000;
const SEED = "bench";

// `--api`: the read API under load, on the app served from a throwaway database (scripts/bench-api.ts).
if (args.includes("--api")) {
  const option = (name: string) => (args.includes(name) ? Number(args[args.indexOf(name) + 1]) : undefined);
  const { benchApi } = await import("./bench-api");
  await benchApi(json, { seconds: option("--seconds"), connections: option("--connections") });
  process.exit(0);
}

// `--search`: the plan-search benchmark on the worker's thread pool instead (scripts/bench-search.ts).
if (args.includes("--search")) {
  const { benchSearch } = await import("./bench-search");
  await benchSearch(json);
  process.exit(0);
}

// `--browser`: the run path in Chromium, click to chart (scripts/bench-browser.ts).
if (args.includes("--browser")) {
  const { benchBrowser } = await import("./bench-browser");
  process.exit(await benchBrowser(args));
}

function best<T>(rounds: number, f: () => T): { ms: number; wallMs: number; value: T } {
  let ms = Infinity;
  let wallMs = Infinity;
  let value!: T;
  for (let r = 0; r < rounds; r++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    value = f();
    const c = process.cpuUsage(c0);
    wallMs = Math.min(wallMs, performance.now() - t0);
    ms = Math.min(ms, (c.user + c.system) / 1000);
  }
  return { ms, wallMs, value };
}

const scenarios = FILES.map((file) => {
  const parsed = parseScenario(JSON.parse(readFileSync(new URL(`../scenarios/${file}`, import.meta.url), "utf8")));
  if (!parsed.ok) throw new Error(`${file}: ${parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  const compiled = compileScenario(parsed.scenario);
  runIterations(compiled, SEED, 0, Math.min(500, iterations)); // warm-up
  const engine = best(5, () => runIterations(compiled, SEED, 0, iterations));
  const bare = compileScenario({ ...parsed.scenario, traffic: undefined, costs: undefined });
  runIterations(bare, SEED, 0, Math.min(500, iterations));
  const engineOnly = best(3, () => runIterations(bare, SEED, 0, iterations));
  const delays = Float64Array.from(engine.value.delayVehHours).sort();
  const days = engine.value.weatherDays;
  const floor = best(5, () => {
    let sink = 0;
    let s: IterationSamples | undefined;
    for (let k = 0; k < iterations; k++) {
      // Buffers recycled as runIterations recycles them, so the floor does not pay allocations the engine avoids.
      s = drawSamples(parsed.scenario, SEED, k, s);
      s.weather.ensure(days[k] + 1);
      sink += s.rateFtPerHour.length;
    }
    return sink;
  });
  return {
    file,
    iterations,
    iterationsPerSecond: Math.round((iterations / engine.ms) * 1000),
    wallIterationsPerSecond: Math.round((iterations / engine.wallMs) * 1000),
    floorIterationsPerSecond: Math.round((iterations / floor.ms) * 1000),
    floorRatio: Math.round((engine.ms / floor.ms) * 100) / 100,
    engineOnlyIterationsPerSecond: Math.round((iterations / engineOnly.ms) * 1000),
    delayP50VehHours: Math.round(delays[Math.max(0, Math.ceil(0.5 * iterations) - 1)]),
    weatherDaysMean: Math.round(days.reduce((a, b) => a + b, 0) / iterations),
  };
});

const main = scenarios[0];
const out = { iterationsPerSecond: main.iterationsPerSecond, floorRatio: main.floorRatio, mainScenario: MAIN, scenarios };
if (json) console.log(JSON.stringify(out, null, 2));
else {
  for (const s of scenarios)
    console.log(`${s.file.padEnd(36)} ${String(s.iterationsPerSecond).padStart(7)} it/s (wall ${s.wallIterationsPerSecond}; no traffic ${s.engineOnlyIterationsPerSecond})   floor ${String(s.floorIterationsPerSecond).padStart(7)} it/s   ratio ${s.floorRatio}   weather days ${s.weatherDaysMean}   delay P50 ${s.delayP50VehHours} veh-h`);
  console.log(`main demo: ${main.iterationsPerSecond} it/s (target ≥ 5,000), floorRatio ${main.floorRatio} (target ≤ 4)`);
}
