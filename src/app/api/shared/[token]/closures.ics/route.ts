import { handler } from "@/lib/server/errors";
import { closuresCalendar, fileName } from "@/lib/server/exports";
import { sharedClosureFeedScenario } from "@/lib/server/shared";

/** The public calendar feed behind a share link: what partner agencies and the public subscribe to. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ token: string }> }) => {
  const { token } = await ctx.params;
  const scenario = await sharedClosureFeedScenario(token);
  return new Response(await closuresCalendar(scenario), {
    headers: { "content-type": "text/calendar; charset=utf-8", "content-disposition": `inline; filename="${fileName(scenario.name, "ics")}"`, "cache-control": "no-store" },
  });
});
