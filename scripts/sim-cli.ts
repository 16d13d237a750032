/**
 * Command line: `npm run sim -- <scenario.json> [--iterations N] [--seed S] [--json]`.
 * Prints one JSON object with --json (iterations, seed, finish P10–P90 as ISO dates, per-operation P50/P80,
 * weather-lost shifts, convergence, …), otherwise a readable summary. Exit codes: 0 done; 2 for a bad
 * command line, an unreadable file, invalid JSON or an invalid scenario (each problem as `path: message`).
 */
import { readFileSync } from "node:fs";
import { compileScenario, parseScenario, runIterations, summarizeRun } from "../sim/index";

function fail(lines: string[]): never {
  for (const l of lines) process.stderr.write(`${l}\n`);
  process.exit(2);
}

const USAGE = "usage: npm run sim -- <scenario.json> [--iterations N] [--seed S] [--json]";
const argv = process.argv.slice(2);
let file: string | undefined;
let iterations = 1000;
let seed = "pourline";
let json = false;
for (let i = 0; i < argv.length; i++) {
  const a = argv[i];
  if (a === "--json") json = true;
  else if (a === "--iterations" || a === "--seed") {
    const v = argv[++i];
    if (v === undefined) fail([`${a} needs a value`, USAGE]);
    if (a === "--seed") seed = v;
    else {
      iterations = Number(v);
      if (!Number.isInteger(iterations) || iterations < 1 || iterations > 1_000_000) fail([`--iterations must be a whole number from 1 to 1,000,000 (got "${v}")`, USAGE]);
    }
  } else if (a.startsWith("--")) fail([`unknown option ${a}`, USAGE]);
  else if (file === undefined) file = a;
  else fail([`only one scenario file, got "${file}" and "${a}"`, USAGE]);
}
if (!file) fail(["no scenario file given", USAGE]);

let text: string;
try {
  text = readFileSync(file, "utf8");
} catch (e) {
  fail([`cannot read scenario file "${file}": ${(e as Error).message}`]);
}
let input: unknown;
try {
  input = JSON.parse(text);
} catch (e) {
  fail([`scenario file "${file}" is not valid JSON: ${(e as Error).message}`]);
}
const parsed = parseScenario(input);
if (!parsed.ok) fail([`scenario "${file}" is not valid:`, ...parsed.problems.map((p) => `${p.path}: ${p.message}`)]);

const compiled = compileScenario(parsed.scenario);
const started = performance.now();
const summary = summarizeRun(compiled, runIterations(compiled, seed, 0, iterations));
const seconds = (performance.now() - started) / 1000;

if (json) {
  const { representative, closureHours, ...rest } = summary;
  const out = {
    ...rest,
    operations: summary.operations.map((o) => ({ id: o.id, name: o.name, finish: o.finish })),
    closureHoursTotal: closureHours.totalByClosure,
    convergence: summary.convergenceDays,
    representative: { iteration: representative.iteration, finish: representative.finish },
    seconds: Math.round(seconds * 1000) / 1000,
  };
  process.stdout.write(`${JSON.stringify(out)}\n`);
} else {
  const s = summary;
  const lines = [
    `${s.scenarioName}`,
    `${s.iterations} iterations, seed "${s.seed}", ${seconds.toFixed(2)} s${s.unfinishedIterations ? `, ${s.unfinishedIterations} unfinished within the horizon` : ""}`,
    `Finish  P10 ${s.finish.p10}   P50 ${s.finish.p50}   P80 ${s.finish.p80}   P90 ${s.finish.p90}`,
    ...(s.target ? [`Target ${s.target.date}: met in ${(s.target.probability * 100).toFixed(1)} % of iterations`] : []),
    ...(s.season1End ? [`Season 1 ends (P50) ${s.season1End.p50}`] : []),
    "Operations (finish P50 / P80):",
    ...s.operations.map((o) => `  ${o.name.padEnd(40)} ${o.finish.p50}  ${o.finish.p80}`),
    `Weather-lost shifts P50 ${s.weatherLostShifts.p50}, P80 ${s.weatherLostShifts.p80}`,
    `Discovered-condition hours P50 ${s.discoveredHours.p50.toFixed(1)}, P80 ${s.discoveredHours.p80.toFixed(1)}`,
    `Closure hours (mean): ${Object.entries(s.closureHours.totalByClosure).map(([k, v]) => `${k} ${v}`).join(", ")}`,
    `Convergence: P80 of the two halves differ by ${s.convergenceDays === null ? "n/a" : `${s.convergenceDays.toFixed(2)} days`}`,
  ];
  process.stdout.write(`${lines.join("\n")}\n`);
}
