import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fieldsOf, validateEntry } from "@/lib/server/progress";
import { progressEntrySchema } from "@/lib/progress-schema";
import { createProgressEntry, listDeletedProgress, listProgress } from "@db/queries/progress";

type Ctx = { params: Promise<{ scenarioId: string }> };

/** The log's shifts, and the deleted ones kept on record (who deleted them, when). */
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  const [entries, deleted] = await Promise.all([listProgress({ scenarioId }), listDeletedProgress({ scenarioId })]);
  return NextResponse.json({ entries, deleted });
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
