import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { scenarioUpdateSchema } from "@/lib/schemas";
import { deleteScenario, getScenario, listRevisions, updateScenario, type ScenarioDetail } from "@db/queries/scenarios";
import type { ScenarioAnswer, ScenarioConflict, ScenarioRecord, ScenarioSavedAnswer } from "@/lib/scenario-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

const scenarioRecord = (s: ScenarioDetail): ScenarioRecord => ({ ...s, createdAt: s.createdAt.toISOString(), updatedAt: s.updatedAt.toISOString() });

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, role, archived } = await requireScenario(scenarioId, "read");
  const revisions = (await listRevisions({ scenarioId })).map((r) => ({ ...r, savedAt: r.savedAt.toISOString() }));
  return NextResponse.json({ scenario: scenarioRecord(scenario), role, archived, revisions } satisfies ScenarioAnswer);
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
    const conflict: ScenarioConflict = { current: current && scenarioRecord(current) };
    throw new AppError("conflict", `Someone else saved this scenario (version ${result.currentVersion}) after you opened version ${body.version}. Nothing was overwritten.`, [], conflict);
  }
  return NextResponse.json({ version: result.version } satisfies ScenarioSavedAnswer);
});

export const DELETE = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "editScenario");
  await deleteScenario({ id: scenarioId });
  return NextResponse.json({ ok: true });
});
