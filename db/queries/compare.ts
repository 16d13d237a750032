import "server-only";
import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { getDb } from "../client";
import { scenarios, simulationRuns } from "../schema";
import { isForecast } from "./runs";
import { reforecastsOf } from "./progress";
import type { CompareFigures } from "../../sim/run-summary-schema";
import { olderRulesSql, staleSql } from "./stale";

/**
 * The part of a stored run that comparing needs: the run summary's compare figures (sim `CompareFigures`), null
 * where a run stored before a figure was recorded lacks it, and its closure hours of either era.
 */
export type CompareSlice = Omit<CompareFigures, NullableFigure | "delay" | "cost"> & { [K in NullableFigure | "delay" | "cost"]: NonNullable<CompareFigures[K]> | null } & {
  /** Crew closure hours of runs stored before the closure timeline. */
  totalByClosure: Record<string, number> | null;
  /** Lane-closed hours, P50 (runs with the closure timeline). */
  laneClosedP50: number | null;
};
type NullableFigure = "unfinishedIterations" | "cdf" | "target";

/**
 * The scenarios `ids` of one project, each with its latest plan run's compare slice (null when never run) and the
 * headline of its newest re-forecast from the field log (every field null when it has none).
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
      runOlderRules: sql<boolean>`${olderRulesSql()}`.as("run_older_rules"),
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
  // The newest re-forecast from the field log: on a job under way the plan runs compared here start from the plan's
  // start and know nothing of the work done, so the page says beside them what the field log has made of the plan.
  const summary = simulationRuns.summary;
  const reforecast = getDb()
    .select({
      dataDate: sql<string | null>`${simulationRuns.dataDate}`.as("reforecast_data_date"),
      createdAt: sql<Date | null>`${simulationRuns.createdAt}`.mapWith(simulationRuns.createdAt).as("reforecast_at"),
      p50: sql<string | null>`${summary} -> 'finish' ->> 'p50'`.as("reforecast_p50"),
      p80: sql<string | null>`${summary} -> 'finish' ->> 'p80'`.as("reforecast_p80"),
      targetDate: sql<string | null>`${summary} ->> 'targetDate'`.as("reforecast_target_date"),
      targetProbability: sql<number | null>`(${summary} ->> 'targetProbability')::float8`.as("reforecast_target_probability"),
      stale: sql<boolean | null>`${staleSql(simulationRuns.scenarioVersion, scenarios.version)}`.as("reforecast_stale"),
      olderRules: sql<boolean | null>`${olderRulesSql()}`.as("reforecast_older_rules"),
    })
    .from(simulationRuns)
    .where(reforecastsOf(scenarios.id))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1)
    .as("newest_reforecast");
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
      runStale: sql<boolean | null>`${staleSql(latest.runVersion, scenarios.version)}`,
      runOlderRules: latest.runOlderRules,
      slice: latest.slice,
      reforecastDataDate: reforecast.dataDate,
      reforecastAt: reforecast.createdAt,
      reforecastP50: reforecast.p50,
      reforecastP80: reforecast.p80,
      reforecastTargetDate: reforecast.targetDate,
      reforecastTargetProbability: reforecast.targetProbability,
      reforecastStale: reforecast.stale,
      reforecastOlderRules: reforecast.olderRules,
    })
    .from(scenarios)
    .leftJoin(latest, eq(latest.scenarioId, scenarios.id))
    .leftJoinLateral(reforecast, sql`true`)
    .where(and(eq(scenarios.projectId, projectId), inArray(scenarios.id, ids)));
}
