import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { forecastAlertsSchema } from "@/lib/schemas";
import { setForecastAlerts } from "@db/queries/forecast-alerts";
import type { ForecastAlertsAnswer } from "@/lib/project-contract";

type Ctx = { params: Promise<{ projectId: string }> };

/**
 * The signed-in member's own forecast e-mails on this project, on or off (every role: it is their inbox). Allowed on
 * an archived project too — it sends nothing, and nobody should be kept from turning e-mail off.
 */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "read");
  const body = await readJson(req, forecastAlertsSchema, { maxBytes: 1024 });
  if (!(await setForecastAlerts({ projectId, userId: user.id, enabled: body.forecastAlerts }))) throw new AppError("not_found", "No such project.");
  return NextResponse.json({ forecastAlerts: body.forecastAlerts } satisfies ForecastAlertsAnswer);
});
