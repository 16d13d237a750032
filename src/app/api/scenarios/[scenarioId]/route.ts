import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { scenarioUpdateSchema } from "@/lib/schemas";
import { deleteScenario, getScenario, listRevisions, updateScenario } from "@db/queries/scenarios";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, role, archived } = await requireScenario(scenarioId, "read");
  return NextResponse.json({ scenario, role, archived, revisions: await listRevisions({ scenarioId }) });
});

/** Saves only over the version the editor loaded; otherwise 409 with the newer version so the user can choose. */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { user } = await requireScenario(scenarioId, "editScenario");
  const body = await readJson(req, scenarioUpdateSchema);
  // The parse output is stored, not the body: unknown keys are dropped and defaults written out.
  const definition = validateDefinition(body.definition);
  const result = await updateScenario({
    id: scenarioId,
    expectedVersion: body.version,
    name: body.name,
    description: body.description,
    definition,
    userId: user.id,
    changeNote: body.changeNote || "Edited",
  });
  if (!result.ok && result.reason === "missing") throw new AppError("not_found", "No such scenario.");
  if (!result.ok) {
    const current = await getScenario({ id: scenarioId });
    throw new AppError("conflict", `Someone else saved this scenario (version ${result.currentVersion}) after you opened version ${body.version}. Nothing was overwritten.`, [], { current });
  }
  return NextResponse.json({ version: result.version });
});

export const DELETE = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "editScenario");
  await deleteScenario({ id: scenarioId });
  return NextResponse.json({ ok: true });
});
