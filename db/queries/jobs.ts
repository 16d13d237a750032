import "server-only";
/**
 * Engine jobs as people see them (status, progress, result) and as workers claim them. The row is the source
 * of truth: pg-boss only carries "job X is due" to a worker, which starts nothing unless this row says so.
 */
import { and, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "../client";
import { engineJobs, scenarioRevisions, type EngineJobKind, type EngineJobStatus } from "../schema";

const LIVE_OR_DONE = sql`status in ('queued', 'running', 'completed')`;

export interface NewEngineJob {
  kind: EngineJobKind;
  projectId: string;
  scenarioId: string;
  scenarioVersion: number;
  seed: string;
  iterations: number;
  dataDate?: string | null;
  runId?: string | null;
  searchId?: string | null;
  bossJobId: string | null;
  singletonKey: string;
  totalUnits: number;
  timeLimitSeconds: number;
  userId: string | null;
  /** Asked for by the daily re-forecast, not by the person pressing a button (engine_jobs.automatic). */
  automatic?: boolean;
}

/**
 * Inserts the job unless the same computation is queued, running or done; returns the job that stands for it
 * and whether it is new (so the caller sends it to the queue only once).
 */
export async function createEngineJob(input: NewEngineJob) {
  const { userId, ...values } = input;
  const [row] = await getDb()
    .insert(engineJobs)
    .values({ ...values, createdById: userId })
    .onConflictDoNothing({ target: engineJobs.singletonKey, where: LIVE_OR_DONE })
    .returning();
  if (row) return { job: row, created: true };
  const [existing] = await getDb()
    .select()
    .from(engineJobs)
    .where(and(eq(engineJobs.singletonKey, input.singletonKey), LIVE_OR_DONE));
  return { job: existing, created: false };
}

export async function getEngineJob({ id }: { id: string }) {
  const [row] = await getDb().select().from(engineJobs).where(eq(engineJobs.id, id));
  return row ?? null;
}
export type EngineJob = NonNullable<Awaited<ReturnType<typeof getEngineJob>>>;

/** A worker takes the job: only a queued job, or a running one whose worker died (a retry), may start. */
export async function claimEngineJob({ id }: { id: string }) {
  const [row] = await getDb()
    .update(engineJobs)
    .set({ status: "running", startedAt: sql`coalesce(${engineJobs.startedAt}, now())` })
    .where(and(eq(engineJobs.id, id), inArray(engineJobs.status, ["queued", "running"])))
    .returning();
  return row ?? null;
}

/** Progress of a running job; returns its status so the worker notices a cancel. */
export async function reportEngineProgress({ id, doneUnits }: { id: string; doneUnits: number }): Promise<EngineJobStatus | null> {
  await getDb()
    .update(engineJobs)
    .set({ doneUnits: sql`greatest(${engineJobs.doneUnits}, ${doneUnits})` })
    .where(and(eq(engineJobs.id, id), eq(engineJobs.status, "running")));
  const [row] = await getDb().select({ status: engineJobs.status }).from(engineJobs).where(eq(engineJobs.id, id));
  return row?.status ?? null;
}

export async function engineJobStatuses({ ids }: { ids: string[] }) {
  if (ids.length === 0) return new Map<string, EngineJobStatus>();
  const rows = await getDb().select({ id: engineJobs.id, status: engineJobs.status }).from(engineJobs).where(inArray(engineJobs.id, ids));
  return new Map(rows.map((r) => [r.id, r.status]));
}

/** Ends a job that is still queued or running (a job already finished or cancelled stays as it is). */
export async function finishEngineJob(input: { id: string; status: "completed" | "failed"; runId?: string | null; error?: string | null }) {
  const [row] = await getDb()
    .update(engineJobs)
    .set({
      status: input.status,
      runId: input.runId === undefined ? sql`${engineJobs.runId}` : input.runId,
      error: input.error ?? null,
      finishedAt: new Date(),
      doneUnits: input.status === "completed" ? sql`${engineJobs.totalUnits}` : sql`${engineJobs.doneUnits}`,
    })
    .where(and(eq(engineJobs.id, input.id), inArray(engineJobs.status, ["queued", "running"])))
    .returning();
  return row ?? null;
}

export async function cancelEngineJob({ id }: { id: string }) {
  const [row] = await getDb()
    .update(engineJobs)
    .set({ status: "cancelled", finishedAt: new Date() })
    .where(and(eq(engineJobs.id, id), inArray(engineJobs.status, ["queued", "running"])))
    .returning();
  return row ?? null;
}

/** The definition a job computes: the saved revision of its version, not whatever the scenario is now. */
export async function getScenarioRevision({ scenarioId, version }: { scenarioId: string; version: number }) {
  const [row] = await getDb()
    .select({ definition: scenarioRevisions.definition })
    .from(scenarioRevisions)
    .where(and(eq(scenarioRevisions.scenarioId, scenarioId), eq(scenarioRevisions.version, version)));
  return row?.definition ?? null;
}
