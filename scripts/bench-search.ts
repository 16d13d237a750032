/**
 * `npm run bench -- --search [--json]`: a fixed plan search on the main demo — 108 variants (crews of two
 * operations 1–3, both holiday policies, six start dates a week apart) × 1,000 iterations — run on the
 * worker's thread pool (workers/server/thread-pool.ts, the code `npm run worker` uses) with 1 and then 2
 * threads. Prints variants per second for each and the speed-up. Wall-clock time, so a machine shared with
 * other work measures lower; each thread is warmed up (TypeScript loaded, engine compiled) before timing.
 */
import { readFileSync } from "node:fs";
import { applyVariant, buildVariants, type SearchSpec } from "../sim/search";
import type { ScenarioInput } from "../sim/schema";
import { formatDayNumber, parseIsoDate } from "../sim/dates";
import { ThreadPool } from "../workers/server/thread-pool";

const ITERATIONS = 1_000;
const SEED = "bench-search";

function fixedSearch(base: ScenarioInput): { spec: SearchSpec; plans: ScenarioInput[] } {
  const crewOps = base.operations.filter((o) => o.kind === "crew").map((o) => o.id);
  const day0 = parseIsoDate(base.startDate);
  const spec: SearchSpec = {
    dimensions: [
      { kind: "crews", operation: crewOps[1], values: [1, 2, 3] },
      { kind: "crews", operation: crewOps[crewOps.length - 2], values: [1, 2, 3] },
      { kind: "holidayPolicy", values: ["standDown", "workThrough"] },
      { kind: "startDate", values: [0, 7, 14, 21, 28, 35].map((d) => formatDayNumber(day0 + d)) },
    ],
    maxVariants: 200,
    iterations: ITERATIONS,
    seed: SEED,
  };
  const { variants } = buildVariants(spec);
  return { spec, plans: variants.map((v) => applyVariant(base, spec.dimensions, v)) };
}

async function measure(plans: ScenarioInput[], threads: number) {
  const pool = new ThreadPool(threads);
  try {
    await Promise.all(Array.from({ length: threads }, () => pool.run({ kind: "variant", definition: plans[0], seed: "warm-up", iterations: 20 }, () => {}).result));
    const t0 = performance.now();
    const results = await Promise.all(plans.map((p) => pool.run({ kind: "variant", definition: p, seed: SEED, iterations: ITERATIONS }, () => {}).result));
    const seconds = (performance.now() - t0) / 1000;
    const bad = results.filter((r) => r.kind !== "variant").length;
    if (bad) throw new Error(`${bad} variants did not run`);
    return { threads, variantsPerSecond: Math.round((plans.length / seconds) * 100) / 100, seconds: Math.round(seconds * 10) / 10 };
  } finally {
    await pool.close();
  }
}

export async function benchSearch(json: boolean) {
  const base = JSON.parse(readFileSync(new URL("../scenarios/kestrel-two-season.json", import.meta.url), "utf8")) as ScenarioInput;
  const { plans } = fixedSearch(base);
  const runs = [];
  for (const threads of [1, 2]) {
    if (!json) console.log(`running ${plans.length} variants × ${ITERATIONS} iterations on ${threads} thread(s) …`);
    runs.push(await measure(plans, threads));
  }
  const speedup = Math.round((runs[1].variantsPerSecond / runs[0].variantsPerSecond) * 100) / 100;
  const out = { search: { variants: plans.length, iterations: ITERATIONS, runs: runs.map(({ threads, variantsPerSecond }) => ({ threads, variantsPerSecond })), speedup } };
  if (json) console.log(JSON.stringify(out, null, 2));
  else {
    for (const r of runs) console.log(`${r.threads} thread(s): ${r.variantsPerSecond} variants/s (${r.seconds} s)`);
    console.log(`speed-up with 2 threads: ${speedup}× (target ≥ 1.5× on an otherwise idle 2-core machine)`);
  }
}
