import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";

export const GET = handler(async (_req: Request, ctx: { params: Promise<{ projectId: string }> }) => {
  const { projectId } = await ctx.params;
  const { project, role } = await requireProject(projectId, "read");
  return NextResponse.json({ project, role });
});
