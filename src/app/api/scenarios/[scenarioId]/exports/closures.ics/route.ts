import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { CALENDAR_RUNS, closuresCalendar, fileName, type CalendarRun } from "@/lib/server/exports";

/**
 * The planned lane closures of a run's representative iteration as an iCalendar file: `?of=plan-run` (the default) the
 * latest plan run, as the Outlook draws it; `?of=forecast` the forecast — on a job under way the newest re-forecast
 * from the field log, whose closures are the ones still ahead.
 */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const of = new URL(req.url).searchParams.get("of") ?? "plan-run";
  if (!(CALENDAR_RUNS as readonly string[]).includes(of)) throw new AppError("bad_request", "Unknown calendar.", [{ path: "of", message: "must be plan-run or forecast" }]);
  return new Response(await closuresCalendar(scenario, of as CalendarRun), {
    headers: { "content-type": "text/calendar; charset=utf-8", "content-disposition": `attachment; filename="${fileName(of === "forecast" ? `${scenario.name}-forecast` : scenario.name, "ics")}"` },
  });
});
