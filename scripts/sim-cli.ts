/**
 * Command line: `npm run sim -- <scenario.json> [--iterations N] [--seed S] [--json] [--tradeoff]`.
 * Prints one JSON object with --json (iterations, seed, finish P10–P90 as ISO dates, per-operation P50/P80,
 * weather-lost shifts, convergence, …; with a traffic/costs section `delay: {vehicleHours: {p50, p80}}` and
 * `cost: {roadUser: {p50, p80}, contract: {p50, p80}}`, and `queueLimitBreaches: {limit: {unit, value}, p50, p80, anyShare}`:
 * days per iteration whose longest queue broke the limit — the scenario's `traffic.queueLimit` (sim/queue-limit),
 * or `--queue-limit-miles X` / `--queue-limit-minutes X` instead), otherwise a readable summary. `--tradeoff` adds the
 * holiday trade-off (same seeds, stand down vs work through). Exit codes: 0 done; 2 for a bad
 * command line, an unreadable file, invalid JSON or an invalid scenario (each problem as `path: message`).
 */
import { readFileSync } from "node:fs";
import { describeQueueLimit, queueLimitOf, queueLimitSchema, type QueueLimit } from "../sim/queue-limit";
import { compileScenario, holidayTradeoff, parseScenario, runIterations, summarizeRun } from "../sim/index";
import { queueBreachCounter } from "../sim/queue-breaches";
import { tuneV8ForEngine } from "../workers/server/engine-v8";

tuneV8ForEngine(); // the engine runs in this process, as in the job worker (workers/server/engine-v8.ts)

function fail(lines: string[]): never {
  for (const l of lines) process.stderr.write(`${l}\n`);
  process.exit(2);
}

const USAGE = "usage: npm run sim -- <scenario.json> [--iterations N] [--seed S] [--json] [--tradeoff] [--queue-limit-miles X | --queue-limit-minutes X]";
const argv = process.argv.slice(2);
let file: string | undefined;
let iterations = 1000;
let seed = "pourline";
let json = false;
let tradeoff = false;
/** A limit given on the command line replaces the scenario's own. */
let limitOverride: QueueLimit | null = null;
for (let i = 0; i < argv.length; i++) {
  const a = argv[i];
  if (a === "--json") json = true;
  else if (a === "--tradeoff") tradeoff = true;
  else if (a === "--queue-limit-miles" || a === "--queue-limit-minutes") {
    const v = argv[++i];
    if (limitOverride) fail([`give one queue limit, in miles or in minutes, not both`, USAGE]);
    const unit = a === "--queue-limit-miles" ? "miles" : "minutes";
    const parsed = queueLimitSchema.safeParse({ unit, value: v === undefined || v.trim() === "" ? NaN : Number(v) });
    if (!parsed.success) fail([`${a} ${parsed.error.issues[0].message} (got "${v ?? ""}")`, USAGE]);
    limitOverride = parsed.data;
  } else if (a === "--iterations" || a === "--seed") {
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
const breaches = queueBreachCounter(compiled, limitOverride ?? queueLimitOf(parsed.scenario));
const summary = summarizeRun(compiled, runIterations(compiled, seed, 0, iterations, undefined, undefined, breaches.read));
const queueLimitBreaches = breaches.quantiles();
const seconds = (performance.now() - started) / 1000;
const trade = tradeoff ? holidayTradeoff(parsed.scenario, seed, iterations) : null;
const money = (x: number | null) => (x === null ? "n/a" : `$${Math.round(x).toLocaleString("en-US")}`);
const vh = (x: number | null) => (x === null ? "n/a" : `${Math.round(x).toLocaleString("en-US")} veh-h`);

if (json) {
  const { representative, laneClosedHours, traffic, stages, ...rest } = summary;
  const out = {
    ...rest,
    ...(rest.delay ? { delay: { vehicleHours: { p50: rest.delay.vehicleHours.p50, p80: rest.delay.vehicleHours.p80 } } } : {}),
    ...(rest.cost
      ? {
          cost: {
            roadUser: rest.cost.roadUser && { p50: rest.cost.roadUser.p50, p80: rest.cost.roadUser.p80 },
            contract: rest.cost.contract && { p50: rest.cost.contract.p50, p80: rest.cost.contract.p80 },
            valueOfTimeYear: rest.cost.valueOfTimeYear,
          },
        }
      : {}),
    ...(traffic ? { maxQueue: traffic.maxQueue } : {}),
    ...(queueLimitBreaches ? { queueLimitBreaches } : {}),
    ...(trade ? { tradeoff: trade } : {}),
    operations: summary.operations.map((o) => ({ id: o.id, name: o.name, finish: o.finish })),
    stages: stages.map((st) => ({ id: st.id, name: st.name, lanes: st.lanes, finish: { p50: st.finish.p50, p80: st.finish.p80, p90: st.finish.p90 } })),
    laneClosedHours: {
      total: laneClosedHours.total,
      byClosure: laneClosedHours.byClosure.map((c) => ({ closure: c.closure, name: c.name, kind: c.kind, lanes: c.lanes, p50: c.p50, p80: c.p80 })),
    },
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
    ...(s.stages.length > 1 ? ["Stages (restored P50 / P80):", ...s.stages.map((st) => `  ${`${st.name} (${st.lanes.join(", ")})`.padEnd(40)} ${st.finish.p50}  ${st.finish.p80}`)] : []),
    `Lane-closed hours P50 ${s.laneClosedHours.total.p50}, P80 ${s.laneClosedHours.total.p80}; by closure (P50): ${s.laneClosedHours.byClosure.map((c) => `${c.closure} ${c.p50}`).join(", ")}`,
    ...(s.winterStandingShare > 0 ? [`A standing closure stays through a winter in ${(s.winterStandingShare * 100).toFixed(1)} % of iterations`] : []),
    `Convergence: P80 of the two halves differ by ${s.convergenceDays === null ? "n/a" : `${s.convergenceDays.toFixed(2)} days`}`,
    ...(s.delay ? [`Delay P50 ${vh(s.delay.vehicleHours.p50)}, P80 ${vh(s.delay.vehicleHours.p80)}${s.traffic?.maxQueue ? `; longest queue (representative) ${s.traffic.maxQueue.miles} mi on ${s.traffic.maxQueue.date}` : ""}`] : []),
    ...(queueLimitBreaches ? [`Days over the queue limit of ${describeQueueLimit(queueLimitBreaches.limit)}: P50 ${queueLimitBreaches.p50}, P80 ${queueLimitBreaches.p80} (at least one in ${(queueLimitBreaches.anyShare * 100).toFixed(1)} % of iterations)`] : []),
    ...(s.cost ? [`Cost (${s.cost.valueOfTimeYear} $): road-user P50 ${money(s.cost.roadUser?.p50 ?? null)}, P80 ${money(s.cost.roadUser?.p80 ?? null)}; contract P50 ${money(s.cost.contract?.p50 ?? null)}, P80 ${money(s.cost.contract?.p80 ?? null)}`] : []),
    ...(trade
      ? [
          `Holiday trade-off: working through holidays finishes ${trade.daysGained.p50 ?? "n/a"} days sooner at P50 (${trade.daysGained.p80 ?? "n/a"} at P80) for ${vh(trade.extraDelayVehHours.p50)} more delay (${money(trade.extraRoadUserCost.p50)}) at P50` +
            `${trade.targetProbabilityChange !== null ? `; chance of meeting the target ${Math.round((trade.standDown.targetProbability ?? 0) * 100)} % → ${Math.round((trade.workThrough.targetProbability ?? 0) * 100)} %` : ""}` +
            `${trade.workThrough.holidayBackupMiles ? `; longest holiday backup (P50) ${trade.standDown.holidayBackupMiles?.p50 ?? 0} → ${trade.workThrough.holidayBackupMiles.p50} mi` : ""}` +
            `${trade.extraContractCost.p50 !== null ? `; contract cost ${trade.extraContractCost.p50 >= 0 ? "+" : "−"}${money(Math.abs(trade.extraContractCost.p50))}` : ""}`,
        ]
      : []),
  ];
  process.stdout.write(`${lines.join("\n")}\n`);
}
