import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { cancelJob, jobView } from "@/lib/server/jobs";
import type { JobAnswer } from "@/lib/job-contract";
import { getEngineJob } from "@db/queries/jobs";

type Ctx = { params: Promise<{ jobId: string }> };

async function jobOf(ctx: Ctx) {
  const { jobId } = await ctx.params;
  const job = z.uuid().safeParse(jobId).success ? await getEngineJob({ id: jobId }) : null;
  if (!job) throw new AppError("not_found", "No such job.");
  return job;
}

/** Status, progress (done / total, time left) and, once done, the stored run or search it produced. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const job = await jobOf(ctx);
  await requireScenario(job.scenarioId, "read");
  return NextResponse.json({ job: jobView(job) } satisfies JobAnswer);
});

/** Cancels a queued or running job: its owner, or a project administrator. */
export const DELETE = handler(async (_req: Request, ctx: Ctx) => {
  const job = await jobOf(ctx);
  const { user, role } = await requireScenario(job.scenarioId, "runScenario", "takeAway");
  if (job.createdById !== user.id && role !== "admin") throw new AppError("forbidden", "Only the person who started this job, or a project administrator, may cancel it.");
  const cancelled = await cancelJob(job);
  if (!cancelled) throw new AppError("conflict", `The job is already ${job.status}; there is nothing to cancel.`);
  return NextResponse.json({ job: jobView(cancelled) } satisfies JobAnswer);
});
