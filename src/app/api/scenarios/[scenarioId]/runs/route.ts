import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { recordRun } from "@/lib/server/runs";
import { MAX_RUN_BODY_BYTES, runWriteSchema } from "@/lib/schemas";
import { listRuns } from "@db/queries/runs";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const runs = await listRuns({ scenarioId });
  return NextResponse.json({ runs: runs.map((r) => ({ ...r, stale: r.scenarioVersion !== scenario.version })) });
});

/**
 * Saves a run of the scenario's current version. The browser sends the summary its worker pool computed;
 * without one, the server computes it (capped, so one request cannot occupy the server for long). Either way the
 * run must fit its work budget (@sim/budget), and the body is at most 8 MB with no field outside the contract.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "runScenario");
  const body = await readJson(req, runWriteSchema, { maxBytes: MAX_RUN_BODY_BYTES });
  const saved = await recordRun({ scenario, body, userId: user.id });
  return NextResponse.json(saved, { status: 201 });
});
