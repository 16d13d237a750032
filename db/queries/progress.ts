import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, desc, eq, inArray, isNotNull, isNull, sql, type AnyColumn, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb } from "../client";
import { engineJobs, progressEntries, progressHistory, scenarios, simulationRuns, users } from "../schema";
import { forecastOrder, isForecast, planRunsOf } from "./runs";
import type { ProgressEntry } from "../../sim/progress-entry";
import { olderRulesSql, runIsStale } from "./stale";

/** The fields a person records about one shift (what history stores before and after a change): the entry contract's output. */
export type ProgressFields = ProgressEntry;

const entryColumns = {
  id: progressEntries.id,
  projectId: progressEntries.projectId,
  scenarioId: progressEntries.scenarioId,
  workDate: progressEntries.workDate,
  shift: progressEntries.shift,
  operationId: progressEntries.operationId,
  fromStationFt: progressEntries.fromStationFt,
  toStationFt: progressEntries.toStationFt,
  crew: progressEntries.crew,
  tempF: progressEntries.tempF,
  rain: progressEntries.rain,
  lostHours: progressEntries.lostHours,
  lostReason: progressEntries.lostReason,
  discovered: progressEntries.discovered,
  version: progressEntries.version,
  enteredById: progressEntries.enteredById,
  enteredByName: users.name,
  createdAt: progressEntries.createdAt,
  updatedAt: progressEntries.updatedAt,
};

/** The recorded fields of a stored row (what history keeps, and what a put-back shift is checked as). */
export const recordedFields = (r: ProgressFields): ProgressFields => ({
  workDate: r.workDate,
  shift: r.shift,
  operationId: r.operationId,
  fromStationFt: r.fromStationFt,
  toStationFt: r.toStationFt,
  crew: r.crew,
  tempF: r.tempF,
  rain: r.rain,
  lostHours: r.lostHours,
  lostReason: r.lostReason,
  discovered: r.discovered,
});

/** The shifts in the log (deleted ones left out) of the scenarios `which` selects, in the order worked. */
function logOf(which: SQL | undefined) {
  return getDb()
    .select(entryColumns)
    .from(progressEntries)
    .innerJoin(users, eq(users.id, progressEntries.enteredById))
    .where(and(which, isNull(progressEntries.deletedAt)))
    .orderBy(asc(progressEntries.workDate), asc(progressEntries.createdAt));
}

export async function listProgress({ scenarioId }: { scenarioId: string }) {
  return logOf(eq(progressEntries.scenarioId, scenarioId));
}
export type ProgressRow = Awaited<ReturnType<typeof listProgress>>[number];

/** An entry in the log; with `deleted`, one taken out of it (to put it back). */
export async function getProgressEntry({ id, deleted = false }: { id: string; deleted?: boolean }) {
  const [row] = await getDb()
    .select(entryColumns)
    .from(progressEntries)
    .innerJoin(users, eq(users.id, progressEntries.enteredById))
    .where(and(eq(progressEntries.id, id), deleted ? isNotNull(progressEntries.deletedAt) : isNull(progressEntries.deletedAt)));
  return row ?? null;
}

/**
 * The field logs of several scenarios at once (deleted shifts left out), each with its scenario's definition:
 * what "progress to date" is computed from on pages that show many projects' plans of record.
 */
export async function listLogsOfScenarios({ scenarioIds }: { scenarioIds: string[] }) {
  if (scenarioIds.length === 0) return [];
  const [plans, entries] = await Promise.all([
    getDb().select({ id: scenarios.id, definition: scenarios.definition }).from(scenarios).where(inArray(scenarios.id, scenarioIds)),
    logOf(inArray(progressEntries.scenarioId, scenarioIds)),
  ]);
  return plans.map((p) => ({ scenarioId: p.id, definition: p.definition, entries: entries.filter((e) => e.scenarioId === p.id) }));
}

const deletedBy = alias(users, "deleted_by_user");

/** A scenario's deleted shifts, most recently deleted first: kept on record with who deleted them and when. */
export async function listDeletedProgress({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({ ...entryColumns, deletedAt: progressEntries.deletedAt, deletedByName: deletedBy.name })
    .from(progressEntries)
    .innerJoin(users, eq(users.id, progressEntries.enteredById))
    .leftJoin(deletedBy, eq(deletedBy.id, progressEntries.deletedById))
    .where(and(eq(progressEntries.scenarioId, scenarioId), isNotNull(progressEntries.deletedAt)))
    .orderBy(desc(progressEntries.deletedAt), asc(progressEntries.id));
}

export async function listProgressHistory({ entryId }: { entryId: string }) {
  return getDb()
    .select({ id: progressHistory.id, changedAt: progressHistory.changedAt, changedByName: users.name, action: progressHistory.action, before: progressHistory.before, after: progressHistory.after })
    .from(progressHistory)
    .innerJoin(users, eq(users.id, progressHistory.changedById))
    .where(eq(progressHistory.entryId, entryId))
    .orderBy(desc(progressHistory.changedAt), asc(sql`${progressHistory.before} is null`));
}

/** Creates an entry and its first history row (before = null) in one transaction. */
type NewEntries = { projectId: string; scenarioId: string; userId: string };
/** A new shift's row and its "create" history row, one id between them (chosen here). */
function newEntryRows(input: NewEntries, entry: ProgressFields) {
  const id = randomUUID();
  const fields = recordedFields(entry);
  return {
    entry: { id, projectId: input.projectId, scenarioId: input.scenarioId, ...fields, enteredById: input.userId },
    history: { entryId: id, changedById: input.userId, action: "create" as const, before: null, after: fields },
  };
}

export async function createProgressEntry(input: NewEntries & { fields: ProgressFields }) {
  return getDb().transaction(async (tx) => {
    const rows = newEntryRows(input, input.fields);
    const [row] = await tx.insert(progressEntries).values(rows.entry).returning({ id: progressEntries.id, version: progressEntries.version });
    await tx.insert(progressHistory).values(rows.history);
    return row;
  });
}

/**
 * Many shifts at once (a field log loaded from a file): every one with its history row, in one transaction, so a
 * failure part-way stores none of them. Inserted in chunks: one statement's parameters stay under PostgreSQL's limit.
 */
export async function createProgressEntries(input: NewEntries & { entries: ProgressFields[] }): Promise<number> {
  if (input.entries.length === 0) return 0;
  return getDb().transaction(async (tx) => {
    for (let i = 0; i < input.entries.length; i += 500) {
      // Ids chosen before the insert, so each history row names its entry without relying on the order rows come back in.
      const chunk = input.entries.slice(i, i + 500).map((e) => newEntryRows(input, e));
      await tx.insert(progressEntries).values(chunk.map((r) => r.entry));
      await tx.insert(progressHistory).values(chunk.map((r) => r.history));
    }
    return input.entries.length;
  });
}

export type ProgressUpdateResult = { ok: true; version: number } | { ok: false; reason: "conflict"; currentVersion: number } | { ok: false; reason: "missing" };

/** Saves only over the version the editor loaded; the history row (before/after, who) is in the same transaction. */
export async function updateProgressEntry(input: { id: string; expectedVersion: number; fields: ProgressFields; userId: string }): Promise<ProgressUpdateResult> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx.select().from(progressEntries).where(and(eq(progressEntries.id, input.id), isNull(progressEntries.deletedAt))).for("update");
    if (!current) return { ok: false, reason: "missing" };
    if (current.version !== input.expectedVersion) return { ok: false, reason: "conflict", currentVersion: current.version };
    const fields = recordedFields(input.fields);
    const [row] = await tx
      .update(progressEntries)
      .set({ ...fields, version: sql`${progressEntries.version} + 1`, updatedAt: new Date() })
      .where(and(eq(progressEntries.id, input.id), eq(progressEntries.version, input.expectedVersion)))
      .returning({ version: progressEntries.version });
    await tx.insert(progressHistory).values({ entryId: input.id, changedById: input.userId, action: "edit", before: recordedFields(current), after: fields });
    return { ok: true, version: row.version };
  });
}

/**
 * Deletes a shift from the log but keeps it on record: marked deleted (who, when) with a history row (after = null)
 * in one transaction. With `expectedVersion`, only the version the person saw: a correction saved meanwhile is
 * not deleted unseen. "missing" when there is no such entry, or it was deleted already.
 */
export async function deleteProgressEntry({ id, userId, expectedVersion }: { id: string; userId: string; expectedVersion?: number }): Promise<ProgressUpdateResult> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx.select().from(progressEntries).where(and(eq(progressEntries.id, id), isNull(progressEntries.deletedAt))).for("update");
    if (!current) return { ok: false, reason: "missing" };
    if (expectedVersion !== undefined && current.version !== expectedVersion) return { ok: false, reason: "conflict", currentVersion: current.version };
    await tx.update(progressEntries).set({ deletedAt: new Date(), deletedById: userId }).where(eq(progressEntries.id, id));
    await tx.insert(progressHistory).values({ entryId: id, changedById: userId, action: "delete", before: recordedFields(current), after: null });
    return { ok: true, version: current.version };
  });
}

/**
 * Puts a deleted shift back in the log as it was (who recorded it stays), one version on and changed now — so a
 * forecast run before counts it as a change it does not know — with a history row, in one transaction.
 * "missing" when it is not deleted (any more).
 */
export async function restoreProgressEntry({ id, userId }: { id: string; userId: string }): Promise<ProgressUpdateResult> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx.select().from(progressEntries).where(and(eq(progressEntries.id, id), isNotNull(progressEntries.deletedAt))).for("update");
    if (!current) return { ok: false, reason: "missing" };
    const [row] = await tx
      .update(progressEntries)
      .set({ deletedAt: null, deletedById: null, version: sql`${progressEntries.version} + 1`, updatedAt: new Date() })
      .where(eq(progressEntries.id, id))
      .returning({ version: progressEntries.version });
    await tx.insert(progressHistory).values({ entryId: id, changedById: userId, action: "restore", before: null, after: recordedFields(current) });
    return { ok: true, version: row.version };
  });
}

/** Re-forecast runs of a scenario, oldest data date first (the drift chart's order), headline figures only. */
export async function listReforecastRuns({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({
      id: simulationRuns.id,
      dataDate: simulationRuns.dataDate,
      scenarioVersion: simulationRuns.scenarioVersion,
      seed: simulationRuns.seed,
      iterations: simulationRuns.iterations,
      summary: simulationRuns.summary,
      createdAt: simulationRuns.createdAt,
      createdByName: users.name,
      // Made by a job the daily re-forecast asked for (in the name of whoever set it up), not by someone pressing Re-forecast.
      automatic: sql<boolean>`exists (select 1 from ${engineJobs} where ${engineJobs.runId} = ${simulationRuns.id} and ${engineJobs.kind} = 'reforecast' and ${engineJobs.automatic})`,
    })
    .from(simulationRuns)
    .leftJoin(users, eq(users.id, simulationRuns.createdById))
    .where(reforecastsOf(scenarioId))
    .orderBy(asc(simulationRuns.dataDate), asc(simulationRuns.createdAt));
}

/**
 * A scenario's re-forecasts (runs with a data date) that count as forecasts — every one does, since only the server
 * computes them — as one condition for each query that looks for them. `scenarioId`: a value or a column.
 */
export function reforecastsOf(scenarioId: string | AnyColumn) {
  return and(eq(simulationRuns.scenarioId, scenarioId), isNotNull(simulationRuns.dataDate), isForecast);
}

/**
 * How many field-log changes a forecast does not know, as a column of any select over simulation_runs: shifts in
 * the log worked after its data date (a plan run has none: it knows no shift), or recorded or corrected after it
 * was run; and shifts it used that were deleted after it was run. Above zero, the forecast is behind the field:
 * the one place this rule is written.
 */
export const shiftsNotInRun = (() => {
  // Named with their table: in a select from simulation_runs alone drizzle writes its columns bare, and a bare
  // "scenario_id" or "created_at" inside this subquery would be the field-log entry's own.
  const run = (c: AnyColumn) => sql`${simulationRuns}.${sql.identifier(c.name)}`;
  const [scenario, dataDate, createdAt] = [run(simulationRuns.scenarioId), run(simulationRuns.dataDate), run(simulationRuns.createdAt)];
  return sql<number>`(
  SELECT count(*)::int FROM ${progressEntries} pe
  WHERE pe.scenario_id = ${scenario}
    AND CASE WHEN pe.deleted_at IS NULL
      THEN pe.work_date > coalesce(${dataDate}, '-infinity'::date) OR pe.updated_at > ${createdAt}
      ELSE pe.deleted_at > ${createdAt} AND pe.created_at <= ${createdAt}
        AND pe.work_date <= coalesce(${dataDate}, '-infinity'::date)
    END
)`;
})();

/** How many field-log changes one run does not know (`shiftsNotInRun`); 0 for an unknown run. */
export async function countShiftsNotInRun({ runId }: { runId: string }): Promise<number> {
  const [row] = await getDb().select({ n: shiftsNotInRun }).from(simulationRuns).where(eq(simulationRuns.id, runId));
  return row?.n ?? 0;
}

/**
 * The forecast that stood at the end of `day` where the work is (`timeZone`): of the runs made on or before that
 * day (a later run, whatever its data date, was not known then), the one `forecastOrder` puts first. Null before the first.
 */
export async function getForecastStandingOn({ scenarioId, day, timeZone }: { scenarioId: string; day: string; timeZone: string }) {
  const [row] = await getDb()
    .select({ dataDate: simulationRuns.dataDate, summary: simulationRuns.summary, createdAt: simulationRuns.createdAt })
    .from(simulationRuns)
    .where(and(eq(simulationRuns.scenarioId, scenarioId), isForecast, sql`(${simulationRuns.createdAt} AT TIME ZONE ${timeZone})::date <= ${day}::date`))
    .orderBy(...forecastOrder)
    .limit(1);
  return row ?? null;
}

const planRunColumns = {
  id: simulationRuns.id,
  scenarioVersion: simulationRuns.scenarioVersion,
  stale: runIsStale(),
  seed: simulationRuns.seed,
  iterations: simulationRuns.iterations,
  summary: simulationRuns.summary,
  createdAt: simulationRuns.createdAt,
};

/** The newest plan run (no data date): the drift chart's first point. */
export async function getLatestPlanRun({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb().select(planRunColumns).from(simulationRuns).where(and(planRunsOf(scenarioId), isForecast)).orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id)).limit(1);
  return row ?? null;
}

/**
 * The same newest plan run with its median iteration as drawn (the trace alone, read out of the stored results), to
 * compare the field's progress with the plan (src/lib/against-plan.ts) as well; null before the plan's first run.
 */
export async function getLatestPlanRunWithTrace({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({ ...planRunColumns, trace: sql<unknown>`${simulationRuns.results} -> 'representative' -> 'trace'` })
    .from(simulationRuns)
    .where(and(planRunsOf(scenarioId), isForecast))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1);
  return row ?? null;
}

/**
 * `getLatestPlanRunWithTrace` for many scenarios in one query, by scenario id (a scenario never run has none): the
 * project list and the forecast e-mails measure each plan of record against its plan run without a query per project.
 */
export async function listLatestPlanRunsWithTrace({ scenarioIds }: { scenarioIds: string[] }) {
  if (scenarioIds.length === 0) return new Map<string, never>();
  const rows = await getDb()
    .selectDistinctOn([simulationRuns.scenarioId], { scenarioId: simulationRuns.scenarioId, ...planRunColumns, trace: sql<unknown>`${simulationRuns.results} -> 'representative' -> 'trace'` })
    .from(simulationRuns)
    .where(and(inArray(simulationRuns.scenarioId, scenarioIds), isNull(simulationRuns.dataDate), isForecast))
    .orderBy(simulationRuns.scenarioId, desc(simulationRuns.createdAt), desc(simulationRuns.id));
  return new Map(rows.map(({ scenarioId, ...run }) => [scenarioId, run]));
}

/** The latest re-forecast's full results (for the chart with actuals). */
export async function getLatestReforecast({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({ id: simulationRuns.id, dataDate: simulationRuns.dataDate, scenarioVersion: simulationRuns.scenarioVersion, stale: runIsStale(), results: simulationRuns.results, createdAt: simulationRuns.createdAt, shiftsNotIn: shiftsNotInRun })
    .from(simulationRuns)
    .where(reforecastsOf(scenarioId))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1);
  return row ?? null;
}

/**
 * The newest re-forecast's headline only (no results): the Outlook, which shows the plan run, says when the field
 * log has moved the forecast on since.
 */
export async function getNewestReforecastHeadline({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({ dataDate: simulationRuns.dataDate, summary: simulationRuns.summary, createdAt: simulationRuns.createdAt, shiftsNotIn: shiftsNotInRun, stale: runIsStale(), olderRules: olderRulesSql(), modelRevision: simulationRuns.modelRevision })
    .from(simulationRuns)
    .where(reforecastsOf(scenarioId))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1);
  return row ?? null;
}
