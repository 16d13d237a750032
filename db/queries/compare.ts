import "server-only";
import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { getDb } from "../client";
import { scenarios, simulationRuns } from "../schema";
import { isForecast } from "./runs";

/** The part of a stored RunSummary that comparing needs (not the trace, histogram or per-day closures). */
export interface CompareSlice {
  startDate: string;
  unfinishedIterations: number;
  finish: { p10: string; p50: string; p80: string; p90: string };
  finishAt: { p10: string; p50: string; p80: string; p90: string };
  cdf: { date: string; p: number }[];
  target: { date: string; probability: number } | null;
  weatherLostShifts: { p50: number; p80: number };
  /** Crew closure hours of runs stored before the closure timeline. */
  totalByClosure: Record<string, number> | null;
  /** Lane-closed hours, P50 (runs with the closure timeline). */
  laneClosedP50: number | null;
  delay: { vehicleHours: { p50: number | null; p80: number | null } } | null;
  cost: { roadUser: { p50: number | null; p80: number | null } | null; contract: { p50: number | null; p80: number | null } | null; valueOfTimeYear?: number } | null;
}

/**
 * The scenarios `ids` of one project, each with its latest run's compare slice (null when never run).
 * Ids of other projects are simply not returned; the caller decides what a missing id means.
 */
export async function listCompareScenarios({ projectId, ids }: { projectId: string; ids: string[] }) {
  if (ids.length === 0) return [];
  const r = simulationRuns.results;
  const latest = getDb()
    .selectDistinctOn([simulationRuns.scenarioId], {
      scenarioId: simulationRuns.scenarioId,
      runId: simulationRuns.id,
      runVersion: simulationRuns.scenarioVersion,
      iterations: simulationRuns.iterations,
      runAt: simulationRuns.createdAt,
      runVerification: simulationRuns.verification,
      slice: sql<CompareSlice>`jsonb_build_object(
        'startDate', ${r} -> 'startDate',
        'unfinishedIterations', ${r} -> 'unfinishedIterations',
        'finish', ${r} -> 'finish',
        'finishAt', ${r} -> 'finishAt',
        'cdf', ${r} -> 'cdf',
        'target', ${r} -> 'target',
        'weatherLostShifts', ${r} -> 'weatherLostShifts',
        'totalByClosure', ${r} -> 'closureHours' -> 'totalByClosure',
        'laneClosedP50', ${r} -> 'laneClosedHours' -> 'total' -> 'p50',
        'delay', ${r} -> 'delay',
        'cost', ${r} -> 'cost')`.as("slice"),
    })
    .from(simulationRuns)
    .where(and(inArray(simulationRuns.scenarioId, ids), isNull(simulationRuns.dataDate), isForecast))
    .orderBy(simulationRuns.scenarioId, desc(simulationRuns.createdAt))
    .as("latest_run");
  return getDb()
    .select({
      id: scenarios.id,
      name: scenarios.name,
      version: scenarios.version,
      runId: latest.runId,
      runVersion: latest.runVersion,
      iterations: latest.iterations,
      runAt: latest.runAt,
      runVerification: latest.runVerification,
      runStale: sql<boolean | null>`(${latest.runVersion} <> ${scenarios.version})`,
      slice: latest.slice,
    })
    .from(scenarios)
    .leftJoin(latest, eq(latest.scenarioId, scenarios.id))
    .where(and(eq(scenarios.projectId, projectId), inArray(scenarios.id, ids)));
}
