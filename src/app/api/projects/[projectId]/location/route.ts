import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { projectLocationSchema } from "@/lib/look-ahead-schemas";
import { setProjectLocation } from "@db/queries/forecast";
import type { ProjectLocation } from "@/lib/project-contract";

type Ctx = { params: Promise<{ projectId: string }> };

/** Where the structure is, for the forecast: set (or cleared) by the project's administrators and engineers. */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "editProject");
  const body = await readJson(req, projectLocationSchema);
  await setProjectLocation({ projectId, latitude: body.latitude, longitude: body.longitude });
  return NextResponse.json({ latitude: body.latitude, longitude: body.longitude } satisfies ProjectLocation);
});
