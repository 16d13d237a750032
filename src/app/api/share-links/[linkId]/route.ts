import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { getShareLink, revokeShareLink } from "@db/queries/shares";

export const DELETE = handler(async (_req: Request, ctx: { params: Promise<{ linkId: string }> }) => {
  const { linkId } = await ctx.params;
  const link = z.uuid().safeParse(linkId).success ? await getShareLink({ id: linkId }) : null;
  if (!link) throw new AppError("not_found", "No such share link.");
  await requireScenario(link.scenarioId, "shareScenario", "takeAway");
  await revokeShareLink({ id: linkId });
  return NextResponse.json({ ok: true });
});
