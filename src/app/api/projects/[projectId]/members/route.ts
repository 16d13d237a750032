import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { memberSchema } from "@/lib/schemas";
import { changeMembership, listMembers } from "@db/queries/projects";
import { LAST_ADMIN } from "@/lib/server/membership";
import { getUserByEmail } from "@db/queries/users";
import type { MembersAnswer } from "@/lib/member-contract";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "read");
  const members = (await listMembers({ projectId })).map((m) => ({ ...m, addedAt: m.addedAt.toISOString() }));
  return NextResponse.json({ members } satisfies MembersAnswer);
});

/** Adds an existing user (or changes their role). Inviting new people by e-mail is a separate flow. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "manageMembers");
  const body = await readJson(req, memberSchema);
  const user = await getUserByEmail({ email: body.email });
  if (!user) throw new AppError("bad_request", "No Pourline user has that e-mail.", [{ path: "email", message: "is not a Pourline user" }]);
  const change = await changeMembership({ projectId, userId: user.id, role: body.role });
  if (!change.ok) throw new AppError("conflict", LAST_ADMIN, [{ path: "role", message: "would leave the project without an administrator" }]);
  return NextResponse.json({ ok: true }, { status: 201 });
});
