import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { lookAheadNoticeSchema } from "@/lib/look-ahead-schemas";
import { getLookAheadNotice, saveLookAheadNotice } from "@db/queries/look-ahead-notices";
import type { LookAheadNoticeAnswer } from "@/lib/look-ahead-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

async function noticeAnswer(scenarioId: string): Promise<LookAheadNoticeAnswer> {
  const notice = await getLookAheadNotice({ scenarioId });
  return { notice: notice && { ...notice, updatedAt: notice.updatedAt.toISOString() } };
}

// Recipients' addresses are personal data: like closure subscribers, only the people who share see and change them.
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "shareScenario", "look");
  return NextResponse.json(await noticeAnswer(scenarioId));
});

export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { user } = await requireScenario(scenarioId, "shareScenario");
  const body = await readJson(req, lookAheadNoticeSchema);
  const recipients = [...new Set(body.recipients.map((r) => r.trim().toLowerCase()))];
  await saveLookAheadNotice({ scenarioId, enabled: body.enabled, hour: body.hour, recipients, userId: user.id });
  return NextResponse.json(await noticeAnswer(scenarioId));
});
