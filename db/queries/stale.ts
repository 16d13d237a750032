import "server-only";
import { sql, type AnyColumn, type SQL } from "drizzle-orm";
import { scenarios, simulationRuns } from "../schema";

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
