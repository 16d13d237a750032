/**
 * Putting engine work on the queue: the job row first (idempotent on its key), then the pg-boss message with
 * the same id, so a job is sent once however often it is asked for. Used by the web server and by workers
 * (which re-enqueue browser runs nobody asked to verify).
 */
import { randomUUID } from "node:crypto";
import type PgBoss from "pg-boss";
import { createEngineJob, finishEngineJob, type NewEngineJob } from "../../db/queries/jobs";
import { createSearch, type NewSearch } from "../../db/queries/searches";
import { ENGINE_QUEUE, type EngineMessage } from "./boss";

/** pg-boss gives up on a handler at its expiry; ours stops the thread first, with time to record why. */
export const EXPIRY_MARGIN_SECONDS = 30;

export async function enqueueJob(boss: PgBoss, input: Omit<NewEngineJob, "bossJobId">, extra: Omit<EngineMessage, "jobId"> = {}) {
  const bossJobId = randomUUID();
  const { job, created } = await createEngineJob({ ...input, bossJobId });
  if (created) {
    try {
      const message: EngineMessage = { ...extra, jobId: job.id };
      await boss.send(ENGINE_QUEUE, message, { id: bossJobId, singletonKey: input.singletonKey, expireInSeconds: input.timeLimitSeconds + EXPIRY_MARGIN_SECONDS });
    } catch (e) {
      await finishEngineJob({ id: job.id, status: "failed", error: "The job could not be queued; ask again." });
      throw e;
    }
  }
  return { job, created };
}

/** A search: its rows, one engine job standing for all of it, and one queued message per variant. */
export async function enqueueSearch(boss: PgBoss, search: Omit<NewSearch, "variants">, variants: { choice: number[] | null; label: string }[], job: { seed: string; iterations: number; timeLimitSeconds: number; singletonKeyOf: (searchId: string) => string }) {
  const rows = variants.map((v, idx) => ({ ...v, idx, bossJobId: randomUUID() }));
  const stored = await createSearch({ ...search, variants: rows });
  const { job: engineJob } = await createEngineJob({
    kind: "search",
    projectId: search.projectId,
    scenarioId: search.scenarioId,
    scenarioVersion: search.scenarioVersion,
    seed: job.seed,
    iterations: job.iterations,
    searchId: stored.id,
    bossJobId: null,
    singletonKey: job.singletonKeyOf(stored.id),
    totalUnits: rows.length * job.iterations,
    timeLimitSeconds: job.timeLimitSeconds,
    userId: search.userId,
  });
  try {
    await boss.insert(
      rows.map((r) => ({
        id: r.bossJobId,
        name: ENGINE_QUEUE,
        data: { jobId: engineJob.id, variant: r.idx } satisfies EngineMessage,
        singletonKey: `${engineJob.id}:${r.idx}`,
        expireInSeconds: job.timeLimitSeconds + EXPIRY_MARGIN_SECONDS,
        retryLimit: 2,
        retryDelay: 2,
      })),
    );
  } catch (e) {
    await finishEngineJob({ id: engineJob.id, status: "failed", error: "The search could not be queued; ask again." });
    throw e;
  }
  return { search: stored, job: engineJob };
}
