import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, badRequest, handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { updateScenario } from "@db/queries/scenarios";
import { getScenarioRevision } from "@db/queries/jobs";
import { getSearch, getVariant } from "@db/queries/searches";
import { variantPlans } from "@/lib/server/searches";
import { validateDefinition } from "@/lib/server/scenario-input";
import type { SearchAdoptedAnswer } from "@/lib/search-contract";

const adoptSchema = z.object({ idx: z.number().int().min(1, "must be a variant of the search") });

/**
 * One variant of a search made the plan itself: a new version of the searched scenario (an ordinary versioned
 * save, with the variant in its change note), which keeps the scenario's field log — what a job under way needs
 * after a search of the rest of the job, where saving the variant as a new scenario would leave the log behind.
 * Only over the version the search varied: a plan saved again since is refused (409), nothing overwritten.
 */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ searchId: string }> }) => {
  const { searchId } = await ctx.params;
  const search = z.uuid().safeParse(searchId).success ? await getSearch({ id: searchId }) : null;
  if (!search) throw new AppError("not_found", "No such search.");
  const { scenario, user } = await requireScenario(search.scenarioId, "editScenario");
  const body = await readJson(req, adoptSchema);
  const variant = await getVariant({ searchId, idx: body.idx });
  if (!variant?.choice) throw badRequest([{ path: "idx", message: "is not a variant of this search" }]);
  const stale = `The plan was saved again after this search (it varied version ${search.scenarioVersion}; the plan is at version ${scenario.version} now). Nothing was changed: search again, or save the variant as a scenario of its own.`;
  if (search.stale) throw new AppError("conflict", stale);
  const base = await getScenarioRevision({ scenarioId: search.scenarioId, version: search.scenarioVersion });
  if (!base) throw new AppError("not_found", "The scenario version this search varied no longer exists.");
  const { plan, changes } = variantPlans(base, search.spec.dimensions)(variant.choice);
  // A variant may choose exactly what the plan has (one of its levels is the plan's own): no version for nothing.
  if (!changes) throw badRequest([{ path: "idx", message: "is the plan as it stands: nothing to change" }]);
  const definition = validateDefinition(plan);
  const result = await updateScenario({
    id: scenario.id,
    expectedVersion: search.scenarioVersion,
    name: scenario.name,
    description: scenario.description,
    definition,
    userId: user.id,
    changeNote: `Variant ${body.idx} of the plan search “${search.name}”: ${variant.label}`,
  });
  if (!result.ok && result.reason === "missing") throw new AppError("not_found", "No such scenario.");
  if (!result.ok) throw new AppError("conflict", stale);
  return NextResponse.json({ scenarioId: scenario.id, version: result.version } satisfies SearchAdoptedAnswer);
});
