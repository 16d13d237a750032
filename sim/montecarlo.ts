/**
 * Monte Carlo runs (MODEL.md, "Monte Carlo"). Contract: `runIterations(compiled, seed, from, to)` simulates
 * iterations from ≤ k < to, each on `drawSamples(scenario, seed, k)`, into typed arrays indexed by
 * k − from. Because iteration k depends only on (scenario, seed, k), ranges run anywhere (a pool of workers)
 * and joined by `mergePartials` equal one run bit for bit (every column is per iteration). `shouldStop` ends a
 * range early (`to` shrinks). Lane-closed hours come from each iteration's closure timeline (./timeline).
 * With a traffic or costs section (./cost) each iteration also records its delay and costs.
 */
import { impactModel, iterationImpact } from "./cost";
import { simulate, type CompiledScenario, type SimResult } from "./engine";
import { drawSamples, type IterationSamples } from "./samples";

export interface PartialRun {
  seed: string;
  from: number;
  to: number;
  nOps: number;
  nStages: number;
  /** Timeline closures: the short-term closures, then one standing closure per stage. */
  nClosures: number;
  days: number;
  /** Overall finish, hours since 00:00 of startDate (Infinity = unfinished). */
  finish: Float64Array;
  /** Iteration-major: opFinish[(k − from) · nOps + op]. */
  opFinish: Float64Array;
  /** Iteration-major: stageFinish[(k − from) · nStages + stage]. */
  stageFinish: Float64Array;
  /** Lane-closed hours of the iteration's closure timeline. */
  laneClosedHours: Float64Array;
  /** Iteration-major: laneClosedByClosure[(k − from) · nClosures + closure]. */
  laneClosedByClosure: Float64Array;
  /** 1 when a standing closure stood in a winter. */
  winterStanding: Float64Array;
  season1End: Float64Array;
  weatherLostShifts: Float64Array;
  discoveredHours: Float64Array;
  /** Days of weather the engine read per iteration (the benchmark's floor draws as many). */
  weatherDays: Float64Array;
  /** Work-zone delay, veh-h (0 without a traffic model). */
  delayVehHours: Float64Array;
  /** Road-user cost, $ (NaN without a traffic model). */
  roadUserCost: Float64Array;
  /** Contract cost, $ (NaN without costs; Infinity when unfinished). */
  contractCost: Float64Array;
}

function emptyPartial(c: CompiledScenario, seed: string, from: number, to: number): PartialRun {
  const n = Math.max(0, to - from);
  const nOps = c.scenario.operations.length;
  const nStages = c.stages.length;
  const nClosures = c.timelineClosures.length;
  const days = c.calendar.days;
  return {
    seed, from, to, nOps, nStages, nClosures, days,
    finish: new Float64Array(n),
    opFinish: new Float64Array(n * nOps),
    stageFinish: new Float64Array(n * nStages),
    laneClosedHours: new Float64Array(n),
    laneClosedByClosure: new Float64Array(n * nClosures),
    winterStanding: new Float64Array(n),
    season1End: new Float64Array(n),
    weatherLostShifts: new Float64Array(n),
    discoveredHours: new Float64Array(n),
    weatherDays: new Float64Array(n),
    delayVehHours: new Float64Array(n),
    roadUserCost: new Float64Array(n),
    contractCost: new Float64Array(n),
  };
}

function truncate(p: PartialRun, done: number): PartialRun {
  const nOps = p.nOps;
  return {
    ...p,
    to: p.from + done,
    finish: p.finish.slice(0, done),
    opFinish: p.opFinish.slice(0, done * nOps),
    stageFinish: p.stageFinish.slice(0, done * p.nStages),
    laneClosedHours: p.laneClosedHours.slice(0, done),
    laneClosedByClosure: p.laneClosedByClosure.slice(0, done * p.nClosures),
    winterStanding: p.winterStanding.slice(0, done),
    season1End: p.season1End.slice(0, done),
    weatherLostShifts: p.weatherLostShifts.slice(0, done),
    discoveredHours: p.discoveredHours.slice(0, done),
    weatherDays: p.weatherDays.slice(0, done),
    delayVehHours: p.delayVehHours.slice(0, done),
    roadUserCost: p.roadUserCost.slice(0, done),
    contractCost: p.contractCost.slice(0, done),
  };
}

export function runIterations(
  compiled: CompiledScenario,
  seed: string,
  from: number,
  to: number,
  onProgress?: (done: number) => void,
  shouldStop?: () => boolean,
  /** Optional per-iteration reader (e.g. ./queue-breaches), called right after each `simulate`, while its timeline is valid. */
  afterIteration?: (k: number, r: SimResult) => void,
): PartialRun {
  const out = emptyPartial(compiled, seed, from, to);
  const nOps = out.nOps;
  const impact = impactModel(compiled);
  if (!impact) {
    out.roadUserCost.fill(NaN);
    out.contractCost.fill(NaN);
  }
  // Each iteration's samples are dead once it is simulated: the next one recycles their buffers.
  let samples: IterationSamples | undefined;
  for (let k = from; k < to; k++) {
    if (shouldStop && shouldStop()) return truncate(out, k - from);
    const j = k - from;
    samples = drawSamples(compiled.scenario, seed, k, samples, compiled.weatherOverride); // forecast override
    const r = simulate(compiled, samples);
    out.finish[j] = r.finish;
    out.opFinish.set(r.opFinish, j * nOps);
    out.stageFinish.set(r.stageFinish, j * out.nStages);
    out.laneClosedHours[j] = r.laneClosedHours;
    out.laneClosedByClosure.set(r.laneClosedByClosure, j * out.nClosures);
    out.winterStanding[j] = r.winterStanding ? 1 : 0;
    out.season1End[j] = r.season1End;
    out.weatherLostShifts[j] = r.weatherLostShifts;
    out.discoveredHours[j] = r.discoveredHours;
    out.weatherDays[j] = r.weatherDaysUsed;
    if (impact) {
      const im = iterationImpact(compiled, impact, r);
      out.delayVehHours[j] = im.delayVehHours;
      out.roadUserCost[j] = im.roadUserCost;
      out.contractCost[j] = im.contractCost;
    }
    if (afterIteration) afterIteration(k, r);
    if (onProgress) onProgress(j + 1);
  }
  return out;
}

/** Joins contiguous ranges (any order) into one; the result equals a single run over the union. */
export function mergePartials(parts: PartialRun[]): PartialRun {
  if (parts.length === 0) throw new Error("mergePartials needs at least one partial run");
  const sorted = [...parts].sort((a, b) => a.from - b.from);
  const first = sorted[0];
  for (let i = 1; i < sorted.length; i++) {
    const p = sorted[i];
    if (p.from !== sorted[i - 1].to) throw new Error(`partial runs are not contiguous: ${sorted[i - 1].to} then ${p.from}`);
    if (p.seed !== first.seed || p.nOps !== first.nOps || p.nStages !== first.nStages || p.nClosures !== first.nClosures || p.days !== first.days)
      throw new Error("partial runs come from different runs");
  }
  type Column = "finish" | "opFinish" | "stageFinish" | "laneClosedHours" | "laneClosedByClosure" | "winterStanding" | "season1End" | "weatherLostShifts" | "discoveredHours" | "weatherDays" | "delayVehHours" | "roadUserCost" | "contractCost";
  const cat = (key: Column) => {
    const total = sorted.reduce((n, p) => n + p[key].length, 0);
    const out = new Float64Array(total);
    let at = 0;
    for (const p of sorted) {
      out.set(p[key], at);
      at += p[key].length;
    }
    return out;
  };
  return {
    seed: first.seed, from: first.from, to: sorted[sorted.length - 1].to,
    nOps: first.nOps, nStages: first.nStages, nClosures: first.nClosures, days: first.days,
    finish: cat("finish"), opFinish: cat("opFinish"), stageFinish: cat("stageFinish"),
    laneClosedHours: cat("laneClosedHours"), laneClosedByClosure: cat("laneClosedByClosure"), winterStanding: cat("winterStanding"),
    season1End: cat("season1End"),
    weatherLostShifts: cat("weatherLostShifts"), discoveredHours: cat("discoveredHours"), weatherDays: cat("weatherDays"),
    delayVehHours: cat("delayVehHours"), roadUserCost: cat("roadUserCost"), contractCost: cat("contractCost"),
  };
}
