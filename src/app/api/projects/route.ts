import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { projectDetailsSchema } from "@/lib/schemas";
import { createProject, listProjectsForUser } from "@db/queries/projects";
import type { ProjectSavedAnswer } from "@/lib/project-contract";

export const GET = handler(async () => {
  const { user } = await requireUser();
  return NextResponse.json({ projects: await listProjectsForUser({ userId: user.id }) });
});

/** A new project: anyone signed in may start one, and becomes its administrator (who then adds the others). */
export const POST = handler(async (req: Request) => {
  const { user } = await requireUser();
  const body = await readJson(req, projectDetailsSchema, { maxBytes: 64 * 1024 });
  const { id } = await createProject({ userId: user.id, project: body });
  return NextResponse.json({ id } satisfies ProjectSavedAnswer, { status: 201 });
});
