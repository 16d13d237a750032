import { NextResponse } from "next/server";
import { AppError, handler } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { countAdmins, getMembershipRole, removeMember } from "@db/queries/projects";

export const DELETE = handler(async (_req: Request, ctx: { params: Promise<{ projectId: string; userId: string }> }) => {
  const { projectId, userId } = await ctx.params;
  await requireProject(projectId, "manageMembers");
  const role = await getMembershipRole({ projectId, userId });
  if (!role) throw new AppError("not_found", "That person is not a member of this project.");
  if (role === "admin" && (await countAdmins({ projectId })) <= 1) {
    throw new AppError("conflict", "A project needs at least one administrator; add another before removing this one.");
  }
  await removeMember({ projectId, userId });
  return NextResponse.json({ ok: true });
});
