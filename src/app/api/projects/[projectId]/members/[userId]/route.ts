import { NextResponse } from "next/server";
import { AppError, handler } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { LAST_ADMIN } from "@/lib/server/membership";
import { changeMembership } from "@db/queries/projects";

export const DELETE = handler(async (_req: Request, ctx: { params: Promise<{ projectId: string; userId: string }> }) => {
  const { projectId, userId } = await ctx.params;
  await requireProject(projectId, "manageMembers");
  const change = await changeMembership({ projectId, userId, role: null });
  if (!change.ok && change.reason === "not_member") throw new AppError("not_found", "That person is not a member of this project.");
  if (!change.ok) throw new AppError("conflict", LAST_ADMIN);
  return NextResponse.json({ ok: true });
});
