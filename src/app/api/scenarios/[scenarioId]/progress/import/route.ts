import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fieldsOf } from "@/lib/server/progress";
import { readShiftsFile } from "@/lib/server/progress-import";
import { workDateSpan } from "@/lib/csv/field-log-import";
import { createProgressEntries } from "@db/queries/progress";
import type { ProgressImportAnswer } from "@/lib/progress-contract";

/**
 * Loads shifts into the field log from a CSV file (form field `file`; the columns of the field log's download, see
 * src/lib/csv/field-log-import.ts): every row checked as a shift recorded by hand is, against the plan, the log and
 * the file's other rows; all stored in one transaction, or none with a 400 naming each line and column.
 */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "recordProgress");
  const { read } = await readShiftsFile(req, scenario);
  const imported = await createProgressEntries({ projectId: scenario.projectId, scenarioId, entries: read.shifts.map((s) => fieldsOf(s.entry)), userId: user.id });
  // readShiftsFile refuses a file without a shift to load, so the span has both ends.
  const { from, to } = workDateSpan(read.shifts.map((s) => s.entry));
  return NextResponse.json({ imported, skippedDeleted: read.skippedDeleted, from: from!, to: to! } satisfies ProgressImportAnswer, { status: 201 });
});
