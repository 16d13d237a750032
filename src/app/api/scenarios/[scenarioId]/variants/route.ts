import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { variantSchema } from "@/lib/schemas";
import { createScenario } from "@db/queries/scenarios";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";

/** A what-if: a copy of the scenario under a new name, owned by whoever made it. */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { user, scenario } = await requireScenario(scenarioId, "editScenario");
  const body = await readJson(req, variantSchema);
  // Re-parsed, so a copy of a row stored before parse outputs were stored carries no unknown keys either.
  const definition = validateDefinition({ ...scenario.definition, name: body.name });
  const row = await createScenario({
    projectId: scenario.projectId,
    name: body.name,
    description: scenario.description,
    definition,
    userId: user.id,
    changeNote: `Variant of “${scenario.name}” v${scenario.version}`,
  });
  return NextResponse.json(row satisfies ScenarioCreatedAnswer, { status: 201 });
});
