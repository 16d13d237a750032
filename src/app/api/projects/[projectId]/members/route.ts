import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { memberSchema } from "@/lib/schemas";
import { listMembers, upsertMember } from "@db/queries/projects";
import { getUserByEmail } from "@db/queries/users";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "read");
  return NextResponse.json({ members: await listMembers({ projectId }) });
});

/** Adds an existing user (or changes their role). Inviting new people by e-mail is a separate flow. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "manageMembers");
  const body = await readJson(req, memberSchema);
  const user = await getUserByEmail({ email: body.email });
  if (!user) throw new AppError("bad_request", "No Pourline user has that e-mail.", [{ path: "email", message: "is not a Pourline user" }]);
  await upsertMember({ projectId, userId: user.id, role: body.role });
  return NextResponse.json({ ok: true }, { status: 201 });
});
