import { NextResponse } from "next/server";
import { badRequest, handler, zodProblems } from "@/lib/server/errors";
import { closurePublicationSchema } from "@/lib/schemas";
import { requireScenario } from "@/lib/server/access";
import { publishClosurePlan } from "@/lib/server/closure-notices";
import { appBaseUrl } from "@/lib/server/mail/links";
import { listClosurePublications } from "@db/queries/closure-notices";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "shareScenario");
  return NextResponse.json({ publications: await listClosurePublications({ scenarioId }) });
});

/**
 * Publishes the planned closures of the latest (current) run and notifies the project's subscribers. The body
 * may name the previewed run (`{runId}`); an empty body publishes the latest run as it is.
 */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "shareScenario");
  const raw = (await req.text()).slice(0, 2_000);
  let body: unknown = {};
  try {
    if (raw.trim()) body = JSON.parse(raw);
  } catch {
    throw badRequest([{ path: "(body)", message: "must be valid JSON" }], "The request body is not valid JSON.");
  }
  const parsed = closurePublicationSchema.safeParse(body);
  if (!parsed.success) throw badRequest(zodProblems(parsed.error));
  return NextResponse.json(await publishClosurePlan({ scenario, userId: user.id, baseUrl: appBaseUrl(req), runId: parsed.data.runId }), { status: 201 });
});
