import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireProject, requireUser } from "@/lib/server/access";
import { answerResponse } from "@/lib/server/http-cache";
import { scenarioListAnswer } from "@/lib/server/read-answers";
import { validateDefinition } from "@/lib/server/scenario-input";
import { scenarioWriteSchema } from "@/lib/schemas";
import { createScenario } from "@db/queries/scenarios";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";

type Ctx = { params: Promise<{ projectId: string }> };

/** The project's scenarios (src/lib/server/read-answers.ts; served beside Next by scripts/serve.mjs). */
export const GET = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  return answerResponse(await scenarioListAnswer(req, projectId, await requireUser()));
});

export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "editScenario");
  const body = await readJson(req, scenarioWriteSchema);
  // The parse output is stored, not the body: unknown keys are dropped and defaults written out.
  const definition = validateDefinition(body.definition);
  const row = await createScenario({ projectId, name: body.name, description: body.description, definition, userId: user.id, changeNote: body.changeNote || "Created" });
  return NextResponse.json(row satisfies ScenarioCreatedAnswer, { status: 201 });
});
