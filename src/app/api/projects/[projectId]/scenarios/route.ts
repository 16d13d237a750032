import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { jsonWithEtag } from "@/lib/server/http-cache";
import { validateDefinition } from "@/lib/server/scenario-input";
import { scenarioWriteSchema } from "@/lib/schemas";
import { createScenario, listProjectScenarios } from "@db/queries/scenarios";

type Ctx = { params: Promise<{ projectId: string }> };

/** With an ETag of the list: a client that already holds it gets 304 (after the membership check). */
export const GET = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "read");
  return jsonWithEtag(req, { scenarios: await listProjectScenarios({ projectId }) });
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
