import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { dailyReforecastSchema } from "@/lib/schemas";
import { setDailyReforecast } from "@db/queries/daily-reforecast";

type Ctx = { params: Promise<{ projectId: string }> };

/**
 * Turns the daily re-forecast of the plan of record on at a local hour, or off (`null`) — the project's
 * administrators and engineers, who choose the plan of record. The re-forecasts are queued as the person who turned it
 * on (src/lib/server/daily-reforecast.ts).
 */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "editProject");
  const body = await readJson(req, dailyReforecastSchema, { maxBytes: 1024 });
  if (!(await setDailyReforecast({ projectId, hour: body.dailyReforecastHour, userId: user.id }))) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ dailyReforecastHour: body.dailyReforecastHour });
});
