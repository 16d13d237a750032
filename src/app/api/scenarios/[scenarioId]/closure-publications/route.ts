import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { previewClosurePlan, publishClosurePlan } from "@/lib/server/closure-notices";
import { appBaseUrl } from "@/lib/server/mail/links";
import { listClosurePublications } from "@db/queries/closure-notices";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** Earlier publications; with `?preview=1`, what publishing now would send (recipients, subject, text), for the confirmation. */
export const GET = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "shareScenario");
  if (new URL(req.url).searchParams.get("preview") === "1") return NextResponse.json({ preview: await previewClosurePlan({ scenario }) });
  return NextResponse.json({ publications: await listClosurePublications({ scenarioId }) });
});

/** Publishes the planned closures of the latest (current) run and notifies the project's subscribers. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "shareScenario");
  return NextResponse.json(await publishClosurePlan({ scenario, userId: user.id, baseUrl: appBaseUrl(req) }), { status: 201 });
});
