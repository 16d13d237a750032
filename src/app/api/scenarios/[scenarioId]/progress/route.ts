import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fieldsOf, validateEntry } from "@/lib/server/progress";
import { progressEntrySchema } from "@/lib/progress-schema";
import { createProgressEntry, listProgress } from "@db/queries/progress";

type Ctx = { params: Promise<{ scenarioId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  return NextResponse.json({ entries: await listProgress({ scenarioId }) });
});

/** Records one shift's progress; every rule that needs the plan or the other entries answers with field paths. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "recordProgress");
  const entry = await readJson(req, progressEntrySchema);
  await validateEntry({ scenario, entry });
  const row = await createProgressEntry({ projectId: scenario.projectId, scenarioId, fields: fieldsOf(entry), userId: user.id });
  return NextResponse.json(row, { status: 201 });
});
