import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { previewClosurePlan } from "@/lib/server/closure-notices";

/** What publishing the closures would send, and to whom — shown before the user confirms. Sends nothing. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "shareScenario");
  return NextResponse.json(await previewClosurePlan({ scenario }));
});
