import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { searchView } from "@/lib/server/searches";
import { getSearch, listVariants } from "@db/queries/searches";
import { getScenarioRevision } from "@db/queries/jobs";
import type { SearchAnswer } from "@/lib/search-contract";

/** A search with every variant so far (partial results while it runs) and its frontier. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ searchId: string }> }) => {
  const { searchId } = await ctx.params;
  const search = z.uuid().safeParse(searchId).success ? await getSearch({ id: searchId }) : null;
  if (!search) throw new AppError("not_found", "No such search.");
  await requireScenario(search.scenarioId, "read");
  const [variants, base] = await Promise.all([listVariants({ searchId }), getScenarioRevision({ scenarioId: search.scenarioId, version: search.scenarioVersion })]);
  return NextResponse.json(searchView(search, variants, base) satisfies SearchAnswer);
});
