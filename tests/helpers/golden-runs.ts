/**
 * Golden runs: a fingerprint of every column of a Monte Carlo run of each demo scenario, so that a change
 * meant only to make the engine faster can be checked to leave every number of every iteration the same,
 * bit for bit (tests/unit/golden-runs.test.ts). `npx tsx tests/helpers/golden-runs.ts --write` rewrites
 * the fixture: do that only for a change that is meant to change results (a model rule in sim/MODEL.md),
 * and say so in the commit. `--print-with-worker-v8`: the fingerprints as JSON, computed with the job worker's V8
 * inlining budgets (workers/server/engine-v8.ts), which must leave them the same.
 */
import { createHash } from "node:crypto";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { compileScenario, parseScenario, runIterations } from "../../sim/index";
import { tuneV8ForEngine } from "../../workers/server/engine-v8";

export const GOLDEN_FILE = new URL("../fixtures/golden-runs.json", import.meta.url);
export const GOLDEN_SEED = "golden";
export const GOLDEN_ITERATIONS = 200;

export type Fingerprint = Record<string, string>;

export function demoFiles(): string[] {
  return readdirSync(new URL("../../scenarios/", import.meta.url)).filter((f) => f.endsWith(".json")).sort();
}

/** sha-256 of each typed-array column's bytes (NaN and Infinity included exactly). */
export function fingerprintDemo(file: string): Fingerprint {
  const parsed = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${file}`, import.meta.url), "utf8")));
  if (!parsed.ok) throw new Error(`${file} does not parse`);
  const run = runIterations(compileScenario(parsed.scenario), GOLDEN_SEED, 0, GOLDEN_ITERATIONS);
  const out: Fingerprint = {};
  for (const [key, value] of Object.entries(run)) {
    if (value instanceof Float64Array) out[key] = createHash("sha256").update(new Uint8Array(value.buffer, value.byteOffset, value.byteLength)).digest("hex").slice(0, 24);
  }
  return out;
}

if (process.argv.includes("--write")) {
  const all: Record<string, Fingerprint> = {};
  for (const f of demoFiles()) all[f] = fingerprintDemo(f);
  writeFileSync(GOLDEN_FILE, JSON.stringify(all, null, 2) + "\n");
  console.log(`wrote ${Object.keys(all).length} golden runs`);
}

if (process.argv.includes("--print-with-worker-v8")) {
  if (!tuneV8ForEngine({})) throw new Error("the worker's V8 settings were not applied");
  const all: Record<string, Fingerprint> = {};
  for (const f of demoFiles()) all[f] = fingerprintDemo(f);
  console.log(JSON.stringify(all));
}
