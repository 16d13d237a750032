import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { projectArchiveSchema } from "@/lib/schemas";
import { setProjectArchived } from "@db/queries/projects";

type Ctx = { params: Promise<{ projectId: string }> };

/**
 * Archives the project or restores it (its administrators). Archived, it stays readable and its members stay;
 * nothing else in it changes until it is restored (src/lib/permissions.ts `ARCHIVED_STILL_ALLOWS`).
 */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "archiveProject");
  const body = await readJson(req, projectArchiveSchema, { maxBytes: 1024 });
  const row = await setProjectArchived({ projectId, userId: user.id, archived: body.archived });
  if (!row) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ id: row.id, archived: row.archivedAt !== null, archivedAt: row.archivedAt });
});
