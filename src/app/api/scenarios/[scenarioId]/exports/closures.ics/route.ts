import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { closuresCalendar, fileName } from "@/lib/server/exports";

/** The planned lane closures (from the latest run's representative iteration) as an iCalendar file. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  return new Response(await closuresCalendar(scenario), {
    headers: { "content-type": "text/calendar; charset=utf-8", "content-disposition": `attachment; filename="${fileName(scenario.name, "ics")}"` },
  });
});
