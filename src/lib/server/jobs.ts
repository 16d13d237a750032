import "server-only";
/**
 * The web server's side of the engine queue: it sends work and reads progress, and never runs the engine.
 * Each request checks its budget here (so an oversized job is refused at once, in words) and the job's
 * time limit follows from the same budget.
 */
import type PgBoss from "pg-boss";
import { cancelEngineJob, type EngineJob } from "@db/queries/jobs";
import { pendingVariantJobIds } from "@db/queries/searches";
import { budgetProblem, runWork, timeLimitSeconds } from "@sim/budget";
import type { Scenario } from "@sim/schema";
import { ENGINE_QUEUE, openBoss } from "@workers/server/boss";
import { enqueueJob } from "@workers/server/enqueue";
import { queueVerification } from "@workers/server/sweep";
import { runJobKey, type Computation } from "@/lib/run-keys";
import type { ForecastInput } from "@/lib/run-record";
import { databaseUrl } from "@db/client";
import type { JobView } from "@/lib/job-contract";
import { badRequest } from "./errors";

const globalForBoss = globalThis as unknown as { __pourlineBoss?: Promise<PgBoss> };

/** One sending pg-boss per server process, opened on first use (the build has no database). */
export function queue(): Promise<PgBoss> {
  if (!globalForBoss.__pourlineBoss) {
    globalForBoss.__pourlineBoss = openBoss(databaseUrl(), "web").catch((e) => {
      globalForBoss.__pourlineBoss = undefined;
      throw e;
    });
  }
  return globalForBoss.__pourlineBoss;
}

/** Refuses a server job beyond the server's work budget (@sim/budget), naming the field and what fits. */
function checkServerBudget(plan: Scenario, iterations: number) {
  const problem = budgetProblem(plan, iterations, "server");
  if (problem) throw badRequest([problem], "The run is larger than the work budget; nothing was run or saved.");
}

export async function queueRunJob(input: { plan: Scenario; projectId: string; computation: Computation; dataDate?: string; userId: string; automatic?: boolean; forecast?: ForecastInput | null }) {
  const { plan, computation: c } = input;
  checkServerBudget(plan, c.iterations);
  const extra = input.forecast ? { forecast: input.forecast } : {};
  return enqueueJob(await queue(), {
    kind: c.reforecast ? "reforecast" : "run",
    projectId: input.projectId,
    scenarioId: c.scenarioId,
    scenarioVersion: c.scenarioVersion,
    seed: c.seed,
    iterations: c.iterations,
    dataDate: c.reforecast?.dataDate ?? null,
    singletonKey: runJobKey(c),
    totalUnits: c.iterations,
    timeLimitSeconds: timeLimitSeconds(runWork(plan, c.iterations).total),
    userId: input.userId,
    ...(input.automatic ? { automatic: true } : {}),
  }, extra);
}

export async function queueVerifyJob(run: { id: string; projectId: string; scenarioId: string; scenarioVersion: number; seed: string; iterations: number; createdById: string }, plan: Scenario) {
  return queueVerification(await queue(), run, plan);
}

/** Cancels a queued or running job: queued messages are withdrawn, a running thread stops within a second. */
export async function cancelJob(job: EngineJob) {
  const cancelled = await cancelEngineJob({ id: job.id });
  if (!cancelled) return null;
  const boss = await queue();
  const ids = job.kind === "search" && job.searchId ? await pendingVariantJobIds({ searchId: job.searchId }) : job.bossJobId ? [job.bossJobId] : [];
  if (ids.length) await boss.cancel(ENGINE_QUEUE, ids);
  return cancelled;
}

/** A job as the API and the browser see it (src/lib/job-contract.ts): progress as a fraction and, once under way, the time left. */
export function jobView(job: EngineJob, now = Date.now()): JobView {
  const fraction = job.totalUnits > 0 ? Math.min(1, job.doneUnits / job.totalUnits) : 0;
  const elapsed = job.startedAt ? (now - job.startedAt.getTime()) / 1000 : 0;
  const secondsLeft = job.status === "running" && fraction > 0 && elapsed > 0 ? Math.round((elapsed / fraction) * (1 - fraction)) : null;
  return {
    id: job.id,
    kind: job.kind,
    status: job.status,
    scenarioId: job.scenarioId,
    scenarioVersion: job.scenarioVersion,
    seed: job.seed,
    iterations: job.iterations,
    dataDate: job.dataDate,
    progress: { done: job.doneUnits, total: job.totalUnits, fraction, secondsLeft },
    timeLimitSeconds: job.timeLimitSeconds,
    runId: job.runId,
    searchId: job.searchId,
    error: job.error,
    createdAt: job.createdAt.toISOString(),
    startedAt: job.startedAt?.toISOString() ?? null,
    finishedAt: job.finishedAt?.toISOString() ?? null,
  };
}
