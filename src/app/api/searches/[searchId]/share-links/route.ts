import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireScenario, type Intent } from "@/lib/server/access";
import { shareLinkSchema } from "@/lib/schemas";
import { createShareLink, listSearchShareLinks } from "@db/queries/shares";
import { getSearch } from "@db/queries/searches";
import { inTransaction } from "@db/queries/mail";
import { newShareToken } from "@/lib/server/share-token";
import { enqueueMailsFor } from "@/lib/server/mail/outbox";
import { searchLinkMail } from "@/lib/server/mail/templates";
import { appBaseUrl } from "@/lib/server/mail/links";
import { shareLinkCreatedAnswer, shareLinksAnswer } from "@/lib/server/share-link-answers";

type Ctx = { params: Promise<{ searchId: string }> };

/** The search and the caller's right to share it: those who may share its scenario may share its searches. */
async function searchToShare(ctx: Ctx, intent: Intent) {
  const { searchId } = await ctx.params;
  const search = z.uuid().safeParse(searchId).success ? await getSearch({ id: searchId }) : null;
  if (!search) throw new AppError("not_found", "No such search.");
  const { user, scenario } = await requireScenario(search.scenarioId, "shareScenario", intent);
  return { search, user, scenario };
}

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { search } = await searchToShare(ctx, "look");
  return NextResponse.json(shareLinksAnswer(await listSearchShareLinks({ searchId: search.id })));
});

/**
 * A read-only link to one plan search (the token, returned once here; only its hash is stored). It opens that
 * search's page and JSON, nothing else. With `emailTo`, the link is e-mailed in the same transaction.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { search, user, scenario } = await searchToShare(ctx, "change");
  const body = await readJson(req, shareLinkSchema);
  const { token, tokenHash } = newShareToken();
  const expiresAt = new Date(Date.now() + body.expiresInDays * 86_400_000);
  const path = `/shared-search/${token}`;
  const recipients = [...new Set(body.emailTo.map((e) => e.trim().toLowerCase()))];
  const row = await inTransaction(async (tx) => {
    const link = await createShareLink({ scenarioId: search.scenarioId, searchId: search.id, tokenHash, label: body.label, userId: user.id, expiresAt, scope: "search", tx });
    await enqueueMailsFor(
      tx,
      { userId: user.id, projectId: scenario.projectId },
      recipients.map((to) => searchLinkMail({ to, searchName: search.name, scenarioName: scenario.name, senderName: user.name, label: body.label, link: `${appBaseUrl(req)}${path}`, expiresAt })),
    );
    return link;
  });
  return NextResponse.json(shareLinkCreatedAnswer(row, { token, path, emailedTo: recipients }), { status: 201 });
});
