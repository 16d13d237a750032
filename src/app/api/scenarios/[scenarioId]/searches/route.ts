import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { jobView } from "@/lib/server/jobs";
import { searchWriteSchema, startSearch } from "@/lib/server/searches";
import { listSearches } from "@db/queries/searches";
import type { SearchStartedAnswer } from "@/lib/search-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** The plan searches saved with this scenario, newest first. */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  return NextResponse.json({ searches: await listSearches({ scenarioId }) });
});

/** Starts a plan search: 202 with the search and the engine job that runs its variants. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "runScenario");
  const body = await readJson(req, searchWriteSchema);
  const { search, job } = await startSearch({ scenario, body, userId: user.id });
  return NextResponse.json({ search: { id: search.id, method: search.method, gridSize: search.gridSize }, job: jobView(job) } satisfies SearchStartedAnswer, { status: 202 });
});
