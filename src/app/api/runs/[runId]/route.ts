import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { getRun } from "@db/queries/runs";

export const GET = handler(async (_req: Request, ctx: { params: Promise<{ runId: string }> }) => {
  const { runId } = await ctx.params;
  const run = z.uuid().safeParse(runId).success ? await getRun({ id: runId }) : null;
  if (!run) throw new AppError("not_found", "No such run.");
  await requireScenario(run.scenarioId, "read");
  return NextResponse.json({ run });
});
