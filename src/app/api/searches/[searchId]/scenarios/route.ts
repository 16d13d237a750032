import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, badRequest, handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { applyVariant } from "@sim/search";
import { createScenario } from "@db/queries/scenarios";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";
import { getScenarioRevision } from "@db/queries/jobs";
import { getSearch, getVariant } from "@db/queries/searches";
import { validateDefinition } from "@/lib/server/scenario-input";

const saveVariantSchema = z.object({
  idx: z.number().int().min(1, "must be a variant of the search"),
  name: z.string().trim().min(1, "must not be empty").max(120),
});

/** One click from a search to a scenario: the variant's plan, saved as a new scenario (an ordinary versioned save). */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ searchId: string }> }) => {
  const { searchId } = await ctx.params;
  const search = z.uuid().safeParse(searchId).success ? await getSearch({ id: searchId }) : null;
  if (!search) throw new AppError("not_found", "No such search.");
  const { user } = await requireScenario(search.scenarioId, "editScenario");
  const body = await readJson(req, saveVariantSchema);
  const variant = await getVariant({ searchId, idx: body.idx });
  if (!variant?.choice) throw badRequest([{ path: "idx", message: "is not a variant of this search" }]);
  const base = await getScenarioRevision({ scenarioId: search.scenarioId, version: search.scenarioVersion });
  if (!base) throw new AppError("not_found", "The scenario version this search varied no longer exists.");
  const definition = { ...applyVariant(validateDefinition(base), search.spec.dimensions, variant.choice), name: body.name };
  validateDefinition(definition);
  const row = await createScenario({
    projectId: search.projectId,
    name: body.name,
    description: `From the plan search “${search.name}”: ${variant.label}`,
    definition,
    userId: user.id,
    changeNote: `Variant ${body.idx} of the search “${search.name}” on “${search.scenarioName}” v${search.scenarioVersion}`,
  });
  return NextResponse.json(row satisfies ScenarioCreatedAnswer, { status: 201 });
});
