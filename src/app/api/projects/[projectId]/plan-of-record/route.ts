import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { planOfRecordSchema } from "@/lib/schemas";
import { setPlanOfRecord } from "@db/queries/projects";

type Ctx = { params: Promise<{ projectId: string }> };

/** Chooses the project's plan of record among its scenarios, or none (its administrators and engineers). */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "editProject");
  const body = await readJson(req, planOfRecordSchema, { maxBytes: 1024 });
  const result = await setPlanOfRecord({ projectId, scenarioId: body.planScenarioId });
  // Another project's scenario answers as one that does not exist: nothing hints that it does.
  if (result === "no_scenario") throw new AppError("not_found", "No such scenario in this project.");
  if (result === "no_project") throw new AppError("not_found", "No such project.");
  return NextResponse.json({ planScenarioId: body.planScenarioId });
});
