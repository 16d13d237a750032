import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { removeClosureSubscriber } from "@db/queries/closure-notices";

export const DELETE = handler(async (_req: Request, ctx: { params: Promise<{ projectId: string; subscriberId: string }> }) => {
  const { projectId, subscriberId } = await ctx.params;
  await requireProject(projectId, "shareScenario", "takeAway");
  const removed = z.uuid().safeParse(subscriberId).success && (await removeClosureSubscriber({ projectId, id: subscriberId }));
  if (!removed) throw new AppError("not_found", "No such subscriber.");
  return NextResponse.json({ ok: true });
});
