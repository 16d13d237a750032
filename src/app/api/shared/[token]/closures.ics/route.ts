import { handler } from "@/lib/server/errors";
import { fileName } from "@/lib/server/exports";
import { appBaseUrl } from "@/lib/server/mail/links";
import { sharedClosureCalendar } from "@/lib/server/published-plan";

/** The public calendar feed behind a share link: what partner agencies and the public subscribe to. */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ token: string }> }) => {
  const { token } = await ctx.params;
  const feed = await sharedClosureCalendar(token, appBaseUrl(req));
  return new Response(feed.ics, {
    headers: { "content-type": "text/calendar; charset=utf-8", "content-disposition": `inline; filename="${fileName(feed.name, "ics")}"`, "cache-control": "no-store" },
  });
});
