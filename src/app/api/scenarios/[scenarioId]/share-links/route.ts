import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { shareLinkSchema } from "@/lib/schemas";
import { createShareLink, listShareLinks } from "@db/queries/shares";
import { inTransaction } from "@db/queries/mail";
import { newShareToken } from "@/lib/server/share-token";
import { enqueueMailsFor } from "@/lib/server/mail/outbox";
import { shareLinkMail } from "@/lib/server/mail/templates";
import { appBaseUrl } from "@/lib/server/mail/links";
import { shareLinkCreatedAnswer, shareLinksAnswer } from "@/lib/server/share-link-answers";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "shareScenario", "look");
  return NextResponse.json(shareLinksAnswer(await listShareLinks({ scenarioId })));
});

/**
 * The token is returned once, here; only its hash is stored. With `emailTo`, the link is also e-mailed to
 * each address; the link and its e-mails are written in one transaction.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { user, scenario } = await requireScenario(scenarioId, "shareScenario");
  const body = await readJson(req, shareLinkSchema);
  const { token, tokenHash } = newShareToken();
  const expiresAt = new Date(Date.now() + body.expiresInDays * 86_400_000);
  const path = `/shared/${token}`;
  const recipients = [...new Set(body.emailTo.map((e) => e.trim().toLowerCase()))];
  const row = await inTransaction(async (tx) => {
    const link = await createShareLink({ scenarioId, tokenHash, label: body.label, userId: user.id, expiresAt, scope: "scenario", tx });
    await enqueueMailsFor(
      tx,
      { userId: user.id, projectId: scenario.projectId },
      recipients.map((to) => shareLinkMail({ to, scenarioName: scenario.name, senderName: user.name, label: body.label, link: `${appBaseUrl(req)}${path}`, expiresAt })),
    );
    return link;
  });
  return NextResponse.json(shareLinkCreatedAnswer(row, { token, path, emailedTo: recipients }), { status: 201 });
});
