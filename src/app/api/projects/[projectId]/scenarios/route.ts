import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { scenarioWriteSchema } from "@/lib/schemas";
import { createScenario, listProjectScenarios } from "@db/queries/scenarios";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "read");
  return NextResponse.json({ scenarios: await listProjectScenarios({ projectId }) });
});

export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "editScenario");
  const body = await readJson(req, scenarioWriteSchema);
  // The parse output is stored, not the body: unknown keys are dropped and defaults written out.
  const definition = validateDefinition(body.definition);
  const row = await createScenario({ projectId, name: body.name, description: body.description, definition, userId: user.id, changeNote: body.changeNote || "Created" });
  return NextResponse.json(row, { status: 201 });
});
