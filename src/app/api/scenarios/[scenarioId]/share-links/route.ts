import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { shareLinkSchema } from "@/lib/schemas";
import { createShareLink, listShareLinks } from "@db/queries/shares";
import { newShareToken } from "@/lib/server/share-token";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "shareScenario");
  return NextResponse.json({ links: await listShareLinks({ scenarioId }) });
});

/** The token is returned once, here; only its hash is stored. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { user } = await requireScenario(scenarioId, "shareScenario");
  const body = await readJson(req, shareLinkSchema);
  const { token, tokenHash } = newShareToken();
  const expiresAt = new Date(Date.now() + body.expiresInDays * 86_400_000);
  const row = await createShareLink({ scenarioId, tokenHash, label: body.label, userId: user.id, expiresAt });
  return NextResponse.json({ ...row, token, path: `/shared/${token}` }, { status: 201 });
});
