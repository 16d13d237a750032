import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { closurePublicationSchema } from "@/lib/schemas";
import { requireScenario } from "@/lib/server/access";
import { closurePublicationsOf, previewClosurePlan, publishClosurePlan } from "@/lib/server/closure-notices";
import { appBaseUrl } from "@/lib/server/mail/links";
import type { ClosurePreviewAnswer } from "@/lib/closure-notice-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** Earlier publications and the newest forecast to compare them with; with `?preview=1`, what publishing now would send (recipients, subject, text), for the confirmation. */
export const GET = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "shareScenario", "look");
  if (new URL(req.url).searchParams.get("preview") === "1") return NextResponse.json({ preview: await previewClosurePlan({ scenario }) } satisfies ClosurePreviewAnswer);
  return NextResponse.json(await closurePublicationsOf({ scenario }));
});

/**
 * Publishes the planned closures of the forecast (the newest re-forecast once there is one, else the newest plan run;
 * of the current version) and
 * notifies the project's subscribers. The body may name the previewed run (`{runId}`); no body publishes the newest
 * forecast as it is.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "shareScenario");
  // Scripts may publish with no body at all; a JSON body goes through the one reader like every route's.
  const body = req.headers.get("content-type")?.includes("application/json") ? await readJson(req, closurePublicationSchema, { maxBytes: 2_048 }) : {};
  return NextResponse.json(await publishClosurePlan({ scenario, userId: user.id, baseUrl: appBaseUrl(req), runId: body.runId }), { status: 201 });
});
