import "server-only";
import { and, desc, eq, gt, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { getDb, prepared } from "../client";
import { projectMembers, scenarios, simulationRuns, users, type RunVerification, type StoredRunResults } from "../schema";
import { storedResultsOf, type StoredResults } from "../stored-results";
import { MODEL_REVISION } from "../../sim/model-revision";
import { olderRulesSql, staleSql } from "./stale";

/** Runs a person may see as a scenario's forecast: computed by the server, or reproduced by it exactly. */
export const FORECAST_VERIFICATIONS: RunVerification[] = ["server", "verified"];
export const isForecast = inArray(simulationRuns.verification, FORECAST_VERIFICATIONS);

export interface NewRun {
  scenarioId: string;
  scenarioVersion: number;
  inputsHash: string;
  seed: string;
  iterations: number;
  dataDate?: string | null;
  summary: Record<string, unknown>;
  results: StoredRunResults;
  durationMs: number;
  userId: string | null;
  verification: "server" | "pending";
  resultKey: string;
}

/**
 * Stores a run once per computation (`resultKey`). When the same computation is already stored, that row is
 * the answer — except a rejected browser run, which is removed so the new result (a server run, or a browser
 * run that will be verified afresh) takes its place. Rejected runs are never a forecast, so nothing refers to them.
 */
export async function saveRun(input: NewRun) {
  const { userId, ...values } = input;
  const returning = { id: simulationRuns.id, createdAt: simulationRuns.createdAt, verification: simulationRuns.verification };
  // What GET /api/runs/:id sends, made here once rather than on every read.
  const stored = storedResultsOf(input.results);
  const insert = () =>
    getDb()
      .insert(simulationRuns)
      // The rules this server computes and verifies by (a browser run was computed by the same bundle of sim/).
      .values({ ...values, ...stored, createdById: userId, modelRevision: MODEL_REVISION })
      .onConflictDoNothing({ target: simulationRuns.resultKey })
      .returning(returning);
  let [row] = await insert();
  if (!row) {
    const removed = await getDb()
      .delete(simulationRuns)
      .where(and(eq(simulationRuns.resultKey, input.resultKey), eq(simulationRuns.verification, "rejected")))
      .returning({ id: simulationRuns.id });
    if (removed.length) [row] = await insert();
  }
  if (row) return { ...row, created: true };
  const [existing] = await getDb().select(returning).from(simulationRuns).where(eq(simulationRuns.resultKey, input.resultKey));
  return { ...existing, created: false };
}

/** The outcome of a verification; only a pending run changes. */
export async function setRunVerification({ id, verification }: { id: string; verification: "verified" | "rejected" }) {
  const [row] = await getDb()
    .update(simulationRuns)
    .set({ verification })
    .where(and(eq(simulationRuns.id, id), eq(simulationRuns.verification, "pending")))
    .returning({ id: simulationRuns.id });
  return !!row;
}

/** Browser runs waiting for the server that no verify job was ever asked for (a worker sweeps these up). */
export async function listUncheckedRuns({ limit = 50 }: { limit?: number } = {}) {
  return getDb()
    .select({ id: simulationRuns.id, scenarioId: simulationRuns.scenarioId, scenarioVersion: simulationRuns.scenarioVersion, seed: simulationRuns.seed, iterations: simulationRuns.iterations, projectId: scenarios.projectId, createdById: simulationRuns.createdById })
    .from(simulationRuns)
    .innerJoin(scenarios, eq(scenarios.id, simulationRuns.scenarioId))
    .where(and(eq(simulationRuns.verification, "pending"), sql`not exists (select 1 from engine_jobs j where j.kind = 'verify' and j.run_id = ${simulationRuns.id})`))
    .orderBy(simulationRuns.createdAt)
    .limit(limit);
}

export async function getRunForCheck({ id }: { id: string }) {
  const [row] = await getDb()
    .select({ id: simulationRuns.id, scenarioId: simulationRuns.scenarioId, scenarioVersion: simulationRuns.scenarioVersion, seed: simulationRuns.seed, iterations: simulationRuns.iterations, dataDate: simulationRuns.dataDate, verification: simulationRuns.verification, results: simulationRuns.results })
    .from(simulationRuns)
    .where(eq(simulationRuns.id, id));
  return row ?? null;
}

/** Runs of the plan itself; re-forecasts (with a data date) are listed with the field log instead. */
/** A scenario's plan runs (no data date: the plan as planned, not a re-forecast from the field log). */
export const planRunsOf = (scenarioId: string) => and(eq(simulationRuns.scenarioId, scenarioId), isNull(simulationRuns.dataDate));

/**
 * Which of a scenario's forecast runs is *the* forecast, first in this order: its newest re-forecast from the field
 * log once it has one, else its newest plan run. A plan run computes the plan from its start date and knows nothing
 * of the work done, so pressing Run on a job under way must not move the project's finish date, its forecast e-mail
 * or the closures published to the public back to the plan's; the re-forecast stays the forecast (marked stale when
 * the plan changed after it) until the next one. One rule for the project list, the forecast e-mail, the closure
 * notices and the forecast history.
 */
export const forecastOrder = [desc(sql`${simulationRuns.dataDate} is not null`), desc(simulationRuns.createdAt), desc(simulationRuns.id)];

/**
 * What every reader of a run gets. "Stale" (computed from an older version than the scenario's), "older
 * rules" (computed under an earlier revision of the model rules) and "plan run" (no data date) are decided
 * here, once, rather than by each page.
 */
const listColumns = {
  id: simulationRuns.id,
  scenarioId: simulationRuns.scenarioId,
  scenarioVersion: simulationRuns.scenarioVersion,
  inputsHash: simulationRuns.inputsHash,
  seed: simulationRuns.seed,
  iterations: simulationRuns.iterations,
  summary: simulationRuns.summary,
  durationMs: simulationRuns.durationMs,
  createdAt: simulationRuns.createdAt,
  createdByName: users.name,
  dataDate: simulationRuns.dataDate,
  verification: simulationRuns.verification,
  stale: staleSql(simulationRuns.scenarioVersion, scenarios.version).as("stale"),
  olderRules: olderRulesSql().as("older_rules"),
  modelRevision: simulationRuns.modelRevision,
  planRun: sql<boolean>`(${simulationRuns.dataDate} is null)`.as("plan_run"),
};

function runsQuery(where: SQL | undefined, withResults: boolean, order: SQL[] = [desc(simulationRuns.createdAt), desc(simulationRuns.id)]) {
  return getDb()
    .select(withResults ? { ...listColumns, results: simulationRuns.results } : { ...listColumns, results: sql<Record<string, unknown> | null>`null` })
    .from(simulationRuns)
    .innerJoin(scenarios, eq(scenarios.id, simulationRuns.scenarioId))
    .leftJoin(users, eq(users.id, simulationRuns.createdById))
    .where(where)
    .orderBy(...order);
}

/** Plan runs, newest first, each with its verification (pending and rejected included, marked as such). */
export async function listRuns({ scenarioId, limit = 20 }: { scenarioId: string; limit?: number }) {
  const rows = await runsQuery(planRunsOf(scenarioId), false).limit(limit);
  return rows.map(({ results: _r, ...r }) => r);
}

export async function getRun({ id }: { id: string }) {
  const [row] = await runsQuery(eq(simulationRuns.id, id), true);
  return row ?? null;
}
export type StoredRun = NonNullable<Awaited<ReturnType<typeof getRun>>>;

/**
 * A run as GET /api/runs/:id sends it, in one prepared query (db/client.ts `prepared`): the fields every reader
 * gets (stale and plan run as above), the tag of its stored results (null on a row older than the stored copy:
 * see `fillStoredResults`) — not the stored bytes, which never change for a tag and which the route keeps in
 * memory (src/lib/server/run-results-cache.ts) — and the asking person's role in the run's project (null =
 * not a member), for the route to check first.
 */
export async function getRunToServe({ id, userId }: { id: string; userId: string }) {
  const [row] = await prepared("run_to_serve", (db) =>
    db
      .select({ ...listColumns, role: projectMembers.role, resultsEtag: simulationRuns.resultsEtag })
      .from(simulationRuns)
      .innerJoin(scenarios, eq(scenarios.id, simulationRuns.scenarioId))
      .leftJoin(users, eq(users.id, simulationRuns.createdById))
      .leftJoin(projectMembers, and(eq(projectMembers.projectId, scenarios.projectId), eq(projectMembers.userId, sql.placeholder("userId"))))
      .where(eq(simulationRuns.id, sql.placeholder("id")))
      .prepare("run_to_serve"),
  ).execute({ id, userId });
  if (!row) return null;
  const { role, resultsEtag, ...fields } = row;
  return { role, fields, resultsEtag };
}

/** The stored copy of a run's results; null when the run is gone or was stored before there was a copy. */
export async function getStoredResults({ id }: { id: string }): Promise<StoredResults | null> {
  const [row] = await getDb()
    .select({
      resultsDeflate: simulationRuns.resultsDeflate,
      resultsCrc32: simulationRuns.resultsCrc32,
      resultsLength: simulationRuns.resultsLength,
      resultsEtag: simulationRuns.resultsEtag,
    })
    .from(simulationRuns)
    .where(eq(simulationRuns.id, id));
  if (!row) return null;
  const { resultsDeflate, resultsCrc32, resultsLength, resultsEtag } = row;
  return resultsDeflate && resultsCrc32 !== null && resultsLength !== null && resultsEtag ? { resultsDeflate, resultsCrc32, resultsLength, resultsEtag } : null;
}

/** Makes and keeps the stored copy of a run stored before there was one (once: a second reader keeps the first's). */
export async function fillStoredResults({ id }: { id: string }): Promise<StoredResults | null> {
  const [row] = await getDb().select({ results: simulationRuns.results }).from(simulationRuns).where(eq(simulationRuns.id, id));
  if (!row) return null;
  const stored = storedResultsOf(row.results);
  await getDb()
    .update(simulationRuns)
    .set(stored)
    .where(and(eq(simulationRuns.id, id), isNull(simulationRuns.resultsEtag)));
  return stored;
}

/** The scenario's forecast: the newest plan run the server computed or verified (never a pending or rejected one). */
export async function getLatestRun({ scenarioId }: { scenarioId: string }) {
  const [row] = await runsQuery(and(planRunsOf(scenarioId), isForecast), true).limit(1);
  return row ?? null;
}

/**
 * The scenario's forecast (`forecastOrder`: its newest re-forecast from the field log, else its newest plan run)
 * with its results: what the planned closures are published from, so the public hears what the field has made of
 * the plan.
 */
export async function getNewestForecast({ scenarioId, withResults = true }: { scenarioId: string; withResults?: boolean }) {
  const [row] = await runsQuery(and(eq(simulationRuns.scenarioId, scenarioId), isForecast), withResults, forecastOrder).limit(1);
  return row ?? null;
}

/**
 * What the outlook shows: the forecast, and separately a newer browser run that is not (or not yet) the
 * forecast — pending verification, or rejected by it.
 */
export async function getOutlookRuns({ scenarioId }: { scenarioId: string }) {
  const forecast = await getLatestRun({ scenarioId });
  const newer = forecast ? gt(simulationRuns.createdAt, forecast.createdAt) : undefined;
  const [unverified] = await runsQuery(and(planRunsOf(scenarioId), inArray(simulationRuns.verification, ["pending", "rejected"]), newer), true).limit(1);
  return { forecast, unverified: unverified ?? null };
}
