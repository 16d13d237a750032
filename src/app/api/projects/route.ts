import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { listProjectsForUser } from "@db/queries/projects";

export const GET = handler(async () => {
  const { user } = await requireUser();
  return NextResponse.json({ projects: await listProjectsForUser({ userId: user.id }) });
});
