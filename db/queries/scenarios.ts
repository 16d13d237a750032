import "server-only";
import { and, asc, desc, eq, isNull, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb, prepared, type Database } from "../client";
import { scenarioRevisions, scenarios, simulationRuns, users, type RunVerification } from "../schema";
import { isForecast } from "./runs";
import { reforecastsOf } from "./progress";
import { olderRulesSql, staleSql } from "./stale";

const owner = alias(users, "owner");
const editor = alias(users, "editor");

const scenarioColumns = {
  id: scenarios.id,
  projectId: scenarios.projectId,
  name: scenarios.name,
  description: scenarios.description,
  version: scenarios.version,
  changeNote: scenarios.changeNote,
  createdAt: scenarios.createdAt,
  updatedAt: scenarios.updatedAt,
  ownerId: scenarios.ownerId,
  ownerName: owner.name,
  updatedById: scenarios.updatedById,
  updatedByName: editor.name,
};

/**
 * The project's scenarios, each with its latest forecast run's headline and whether a newer browser run waits
 * for the server. The runs are looked up per scenario (LATERAL, newest first on runs_scenario_idx), so the
 * cost follows the project's scenarios, not every run of every project; only the small `summary` is read.
 */
export async function listProjectScenarios({ projectId }: { projectId: string }) {
  // Prepared: the list is read on every visit to a project (db/client.ts `prepared`).
  return prepared("project_scenarios", projectScenarios).execute({ projectId });
}

function projectScenarios(db: Database) {
  // Every field of the three lateral joins is null for a scenario without such a run: typed so, for the readers.
  const latestRun = db
    .select({
      runId: sql<string | null>`${simulationRuns.id}`.as("run_id"),
      runVersion: sql<number | null>`${simulationRuns.scenarioVersion}`.as("run_version"),
      runSummary: sql<Record<string, unknown> | null>`${simulationRuns.summary}`.as("run_summary"),
      runAt: sql<Date | null>`${simulationRuns.createdAt}`.mapWith(simulationRuns.createdAt).as("run_at"),
      runVerification: sql<RunVerification | null>`${simulationRuns.verification}`.as("run_verification"),
      runOlderRules: sql<boolean | null>`${olderRulesSql()}`.as("run_older_rules"),
    })
    .from(simulationRuns)
    .where(and(eq(simulationRuns.scenarioId, scenarios.id), isNull(simulationRuns.dataDate), isForecast))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1)
    .as("latest_run");
  // A browser run still waiting for the server is not the forecast; the list only says one exists.
  const pendingRun = db
    .select({ pendingAt: sql<Date | null>`${simulationRuns.createdAt}`.mapWith(simulationRuns.createdAt).as("pending_at") })
    .from(simulationRuns)
    .where(and(eq(simulationRuns.scenarioId, scenarios.id), isNull(simulationRuns.dataDate), eq(simulationRuns.verification, "pending")))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1)
    .as("pending_run");
  // The newest re-forecast from the field log: the table says it beside the plan run's figures, so a job under way
  // does not read as still finishing on the plan's dates.
  const latestReforecast = db
    .select({
      reforecastP80: sql<string | null>`${simulationRuns.summary}->'finish'->>'p80'`.as("reforecast_p80"),
      reforecastDataDate: sql<string | null>`${simulationRuns.dataDate}`.as("reforecast_data_date"),
    })
    .from(simulationRuns)
    .where(reforecastsOf(scenarios.id))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1)
    .as("latest_reforecast");
  return db
    .select({
      ...scenarioColumns,
      runId: latestRun.runId,
      runVersion: latestRun.runVersion,
      runSummary: latestRun.runSummary,
      runAt: latestRun.runAt,
      runVerification: latestRun.runVerification,
      runStale: sql<boolean | null>`${staleSql(latestRun.runVersion, scenarios.version)}`,
      runOlderRules: latestRun.runOlderRules,
      pendingRunAt: pendingRun.pendingAt,
      reforecastP80: latestReforecast.reforecastP80,
      reforecastDataDate: latestReforecast.reforecastDataDate,
    })
    .from(scenarios)
    .innerJoin(owner, eq(owner.id, scenarios.ownerId))
    .innerJoin(editor, eq(editor.id, scenarios.updatedById))
    .leftJoinLateral(latestRun, sql`true`)
    .leftJoinLateral(pendingRun, sql`true`)
    .leftJoinLateral(latestReforecast, sql`true`)
    .where(eq(scenarios.projectId, sql.placeholder("projectId")))
    // Scenarios written in one transaction (the seed's) share updated_at: without the name and id after it, two
    // connections with different plans for this query listed them in different orders, so with different ETags.
    .orderBy(desc(scenarios.updatedAt), asc(scenarios.name), asc(scenarios.id))
    .prepare("project_scenarios");
}

export async function getScenario({ id }: { id: string }) {
  const [row] = await getDb()
    .select({ ...scenarioColumns, definition: scenarios.definition })
    .from(scenarios)
    .innerJoin(owner, eq(owner.id, scenarios.ownerId))
    .innerJoin(editor, eq(editor.id, scenarios.updatedById))
    .where(eq(scenarios.id, id));
  return row ?? null;
}
export type ScenarioDetail = NonNullable<Awaited<ReturnType<typeof getScenario>>>;

export async function createScenario(input: {
  projectId: string;
  name: string;
  description: string;
  definition: Record<string, unknown>;
  userId: string;
  changeNote?: string;
}) {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(scenarios)
      .values({
        projectId: input.projectId,
        name: input.name,
        description: input.description,
        definition: input.definition,
        ownerId: input.userId,
        updatedById: input.userId,
        changeNote: input.changeNote ?? "Created",
      })
      .returning({ id: scenarios.id, version: scenarios.version });
    await tx.insert(scenarioRevisions).values({
      scenarioId: row.id,
      version: row.version,
      definition: input.definition,
      savedById: input.userId,
      changeNote: input.changeNote ?? "Created",
    });
    return row;
  });
}

export type UpdateResult = { ok: true; version: number } | { ok: false; reason: "conflict"; currentVersion: number } | { ok: false; reason: "missing" };

/** Saves only when the caller saw the latest version; a stale save changes nothing and reports a conflict. */
export async function updateScenario(input: {
  id: string;
  expectedVersion: number;
  name: string;
  description: string;
  definition: Record<string, unknown>;
  userId: string;
  changeNote: string;
}): Promise<UpdateResult> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(scenarios)
      .set({
        name: input.name,
        description: input.description,
        definition: input.definition,
        version: sql`${scenarios.version} + 1`,
        updatedById: input.userId,
        changeNote: input.changeNote,
        updatedAt: new Date(),
      })
      .where(and(eq(scenarios.id, input.id), eq(scenarios.version, input.expectedVersion)))
      .returning({ version: scenarios.version });
    if (!row) {
      const [current] = await tx.select({ version: scenarios.version }).from(scenarios).where(eq(scenarios.id, input.id));
      return current ? { ok: false, reason: "conflict", currentVersion: current.version } : { ok: false, reason: "missing" };
    }
    await tx.insert(scenarioRevisions).values({
      scenarioId: input.id,
      version: row.version,
      definition: input.definition,
      savedById: input.userId,
      changeNote: input.changeNote,
    });
    return { ok: true, version: row.version };
  });
}

export async function deleteScenario({ id }: { id: string }) {
  const rows = await getDb().delete(scenarios).where(eq(scenarios.id, id)).returning({ id: scenarios.id });
  return rows.length > 0;
}

export async function listRevisions({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({ version: scenarioRevisions.version, changeNote: scenarioRevisions.changeNote, savedAt: scenarioRevisions.savedAt, savedByName: users.name })
    .from(scenarioRevisions)
    .innerJoin(users, eq(users.id, scenarioRevisions.savedById))
    .where(eq(scenarioRevisions.scenarioId, scenarioId))
    .orderBy(desc(scenarioRevisions.version));
}

/**
 * One saved version of a scenario and the version before it (null for the first): what changed in a save, read from
 * the stored definitions. Null when the scenario has no such version.
 */
export async function getRevisionWithPrevious({ scenarioId, version }: { scenarioId: string; version: number }) {
  const rows = await getDb()
    .select({ version: scenarioRevisions.version, definition: scenarioRevisions.definition, changeNote: scenarioRevisions.changeNote, savedAt: scenarioRevisions.savedAt, savedByName: users.name })
    .from(scenarioRevisions)
    .innerJoin(users, eq(users.id, scenarioRevisions.savedById))
    .where(and(eq(scenarioRevisions.scenarioId, scenarioId), sql`${scenarioRevisions.version} in (${version}, ${version - 1})`))
    .orderBy(desc(scenarioRevisions.version));
  const [revision, previous] = rows[0]?.version === version ? [rows[0], rows[1] ?? null] : [null, null];
  if (!revision) return null;
  return { ...revision, previous: previous && { version: previous.version, definition: previous.definition } };
}

export async function countScenarios(): Promise<number> {
  const [row] = await getDb().select({ n: sql<number>`count(*)::int` }).from(scenarios);
  return row.n;
}
