import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { runReforecast } from "@/lib/server/progress";
import { reforecastSchema } from "@/lib/progress-schema";
import { getLatestPlanRun, listReforecastRuns } from "@db/queries/progress";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** The drift series: the latest plan run (first point) and every re-forecast, oldest data date first. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const [plan, runs] = await Promise.all([getLatestPlanRun({ scenarioId }), listReforecastRuns({ scenarioId })]);
  const stale = (v: number) => v !== scenario.version;
  return NextResponse.json({ plan: plan && { ...plan, stale: stale(plan.scenarioVersion) }, runs: runs.map((r) => ({ ...r, stale: stale(r.scenarioVersion) })) });
});

/**
 * Re-forecasts from the as-built state at `dataDate`: the server computes it (at most 5,000 iterations) and
 * stores it as a run with that data date.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "runScenario");
  const body = await readJson(req, reforecastSchema);
  const saved = await runReforecast({ scenario, body, userId: user.id });
  return NextResponse.json(saved, { status: 201 });
});
