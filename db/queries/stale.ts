import "server-only";
import { sql, type AnyColumn, type SQL } from "drizzle-orm";
import { scenarios, simulationRuns } from "../schema";
import { MODEL_REVISION } from "../../sim/model-revision";

/**
 * The one rule for "stale": a run or plan search was computed for another version of its scenario than the one
 * saved now (someone changed the plan after it). Every query that says whether something is stale selects this;
 * code outside the data layer reads that column and never compares versions itself.
 */
export function staleSql(computedFor: AnyColumn | SQL | SQL.Aliased, current: AnyColumn | SQL | SQL.Aliased) {
  return sql<boolean>`(${computedFor} <> ${current})`;
}

/** `staleSql` of a `simulation_runs` row against its own scenario, for queries that do not join the scenario. */
export const runIsStale = () => staleSql(simulationRuns.scenarioVersion, sql`(select s.version from ${scenarios} s where s.id = ${simulationRuns.scenarioId})`);

/**
 * The one rule for "older rules": a `simulation_runs` row (or, given its column, a plan search) computed under an
 * earlier revision of the model rules than this engine's (sim/model-revision.ts). Its figures are what the old rules said; running again gives
 * today's. Not "stale" (the plan did not change), so it is said in its own words.
 */
export const olderRulesSql = (revision: AnyColumn = simulationRuns.modelRevision) => sql<boolean>`(${revision} < ${MODEL_REVISION})`;
