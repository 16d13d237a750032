import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { closureWeeklySchema } from "@/lib/schemas";
import { getClosureWeekly, setClosureWeekly } from "@db/queries/closure-weekly";
import type { ClosureWeeklyAnswer } from "@/lib/closure-notice-contract";

type Ctx = { params: Promise<{ projectId: string }> };

/** The weekly closure e-mail's setting and what its last day did — for the people who publish closures. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "shareScenario", "look");
  const row = await getClosureWeekly({ projectId });
  if (!row) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ closureWeeklyDay: row.day, closureWeeklyHour: row.hour, lastOn: row.lastOn, note: row.note } satisfies ClosureWeeklyAnswer);
});

/**
 * Turns the weekly closure e-mail to the project's closure-notice subscribers on (a weekday and a local hour) or off
 * (both null) — the people who publish closures and keep that list. It sends only what was published
 * (src/lib/server/closure-weekly.ts).
 */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "shareScenario");
  const body = await readJson(req, closureWeeklySchema, { maxBytes: 1024 });
  if (!(await setClosureWeekly({ projectId, day: body.closureWeeklyDay, hour: body.closureWeeklyHour }))) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ closureWeeklyDay: body.closureWeeklyDay, closureWeeklyHour: body.closureWeeklyHour });
});
