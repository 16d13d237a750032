import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { queueReforecast } from "@/lib/server/progress";
import { jobView } from "@/lib/server/jobs";
import type { JobAnswer } from "@/lib/job-contract";
import { reforecastSchema } from "@/lib/progress-schema";
import { getLatestPlanRun, listReforecastRuns } from "@db/queries/progress";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** The drift series: the latest plan run (first point) and every re-forecast, oldest data date first. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const [plan, runs] = await Promise.all([getLatestPlanRun({ scenarioId }), listReforecastRuns({ scenarioId })]);
  const stale = (v: number) => v !== scenario.version; // the drift series carries headline figures only
  return NextResponse.json({ plan: plan && { ...plan, stale: stale(plan.scenarioVersion) }, runs: runs.map((r) => ({ ...r, stale: stale(r.scenarioVersion) })) });
});

/**
 * Asks for a re-forecast from the as-built state at `dataDate`: 202 with the engine job; a worker computes it
 * and stores it as a run with that data date (GET /api/jobs/:id follows it).
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "runScenario");
  const body = await readJson(req, reforecastSchema);
  const job = await queueReforecast({ scenario, body, userId: user.id });
  return NextResponse.json({ job: jobView(job) } satisfies JobAnswer, { status: 202 });
});
