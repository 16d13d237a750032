import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { scenarioLookAhead } from "@/lib/server/look-ahead";
import type { LookAheadBoard } from "@/lib/look-ahead-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** The next 7 days × shifts × weather-gated operations: `{days, today, timeZone, rainRule, forecast}`. Every member reads it. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  return NextResponse.json((await scenarioLookAhead(scenario)) satisfies LookAheadBoard, { headers: { "cache-control": "no-store" } });
});
