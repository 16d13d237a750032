import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { recordRun } from "@/lib/server/runs";
import { MAX_RUN_BODY_BYTES, runWriteSchema } from "@/lib/schemas";
import { listRuns } from "@db/queries/runs";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  // Each run carries stale, planRun and verification from the data layer.
  return NextResponse.json({ runs: await listRuns({ scenarioId }) });
});

/**
 * A run of the scenario's current version. With the summary a browser's worker pool computed: stored at once
 * as "pending" (201) and queued for verification. Without one: 202 with an engine job that computes it (capped,
 * so one request cannot occupy a worker for long). Either way the run must fit its work budget (@sim/budget),
 * and the body is at most 8 MB with no field outside the contract.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "runScenario");
  const body = await readJson(req, runWriteSchema, { maxBytes: MAX_RUN_BODY_BYTES });
  const saved = await recordRun({ scenario, body, userId: user.id });
  return NextResponse.json(saved.body, { status: saved.status });
});
