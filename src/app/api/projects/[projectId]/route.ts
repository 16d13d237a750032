import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { projectDetailsSchema } from "@/lib/schemas";
import { updateProject } from "@db/queries/projects";
import type { ProjectSavedAnswer } from "@/lib/project-contract";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { project, role } = await requireProject(projectId, "read");
  return NextResponse.json({ project, role });
});

/** The project's details, replaced whole (the same contract as starting one): its administrators and engineers. */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "editProject");
  const body = await readJson(req, projectDetailsSchema, { maxBytes: 64 * 1024 });
  // Removed between the check and the write: the same answer as any project that is not there.
  if (!(await updateProject({ projectId, project: body }))) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ id: projectId } satisfies ProjectSavedAnswer);
});
