/**
 * The engine's public API. Everything a caller (CLI, worker pool, server, tests) needs, re-exported from the
 * modules that own it, plus `runScenario` for the one-call case.
 */
import { compileScenario } from "./engine";
import { runIterations } from "./montecarlo";
import type { Scenario } from "./schema";
import { summarizeRun, type RunSummary } from "./summary";

export { parseScenario, type ParseResult } from "./validate";
export { buildAsBuilt, DISCOVERY_PRIOR_PACKETS, type AsBuiltState, type ProgressRecord, type DiscoveredItem } from "./asbuilt";
export { compileScenario, simulate, type CompileOptions, type CompiledScenario, type SimResult, type Trace, type TracePacket, type PauseRecord } from "./engine";
export { runIterations, mergePartials, type PartialRun } from "./montecarlo";
export { summarizeRun, type RunSummary, type DateQuantiles, type NumberQuantiles, type TrafficDay, type TrafficDetail } from "./summary";
export { holidayTradeoff, withHolidayPolicy, type HolidayTradeoff, type PolicyOutcome, type HolidayPolicy } from "./tradeoff";
export { compileTraffic, queueDelay, queuePiece, krammesLopezCapacity, hcm6WorkZone, heavyVehicleFactor, queueMiles, DEMAND_KINDS, type TrafficModel } from "./traffic";
export { impactModel, iterationImpact, roadUserCost, contractCost, DEFAULT_VALUE_OF_TIME } from "./cost";
export { drawSamples, type IterationSamples } from "./samples";
export { nearestRank, quantiles } from "./percentiles";
export { HORIZON_DAYS } from "./calendar";
export { MODEL_REVISION } from "./model-revision";
export type { Scenario, ScenarioInput, FieldProblem, Traffic, Costs } from "./schema";

export function runScenario(scenario: Scenario, opts: { iterations: number; seed: string }): RunSummary {
  const compiled = compileScenario(scenario);
  return summarizeRun(compiled, runIterations(compiled, opts.seed, 0, opts.iterations));
}
