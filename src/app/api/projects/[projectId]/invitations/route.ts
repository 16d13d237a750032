import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { invitationSchema } from "@/lib/server/mail/schemas";
import { newShareToken } from "@/lib/server/share-token";
import { enqueueMailsFor } from "@/lib/server/mail/outbox";
import { invitationMail } from "@/lib/server/mail/templates";
import { appBaseUrl } from "@/lib/server/mail/links";
import { insertInvitation, listPendingInvitations } from "@db/queries/invitations";
import { inTransaction } from "@db/queries/mail";
import { listMembers } from "@db/queries/projects";
import type { InvitationCreatedAnswer, InvitationsAnswer } from "@/lib/member-contract";

type Ctx = { params: Promise<{ projectId: string }> };

const INVITATION_DAYS = 7;

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "manageMembers", "look");
  const invitations = (await listPendingInvitations({ projectId })).map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString(), createdAt: i.createdAt.toISOString() }));
  return NextResponse.json({ invitations } satisfies InvitationsAnswer);
});

/**
 * Invites someone by e-mail. The invitation and its e-mail are written in one transaction: either both
 * exist or neither. The token travels only in the e-mail; the response does not carry it.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user, project } = await requireProject(projectId, "manageMembers");
  const body = await readJson(req, invitationSchema);
  const email = body.email.trim().toLowerCase();
  if ((await listMembers({ projectId })).some((m) => m.email === email)) {
    throw new AppError("conflict", "That person is already a member of this project.", [{ path: "email", message: "is already a member" }]);
  }
  const { token, tokenHash } = newShareToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  const link = `${appBaseUrl(req)}/invite/${token}`;
  const row = await inTransaction(async (tx) => {
    const inv = await insertInvitation({ tx, projectId, email, role: body.role, tokenHash, invitedById: user.id, expiresAt });
    await enqueueMailsFor(tx, { userId: user.id, projectId }, [invitationMail({ to: email, projectName: project.name, role: body.role, inviterName: user.name, link, expiresAt })]);
    return inv;
  });
  const answer: InvitationCreatedAnswer = { ...row, expiresAt: row.expiresAt.toISOString(), createdAt: row.createdAt.toISOString() };
  return NextResponse.json(answer, { status: 201 });
});
