import { NextResponse } from "next/server";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { readCsvUpload, rowErrors } from "@/lib/server/csv-upload";
import { fieldsOf, toRule } from "@/lib/server/progress";
import { validateDefinition } from "@/lib/server/scenario-input";
import { readFieldLogCsv } from "@/lib/csv/field-log-import";
import { todayIn } from "@/lib/progress-schema";
import { createProgressEntries, listProgress } from "@db/queries/progress";
import type { ProgressImportAnswer } from "@/lib/progress-contract";

/**
 * Loads shifts into the field log from a CSV file (form field `file`; the columns of the field log's download, see
 * src/lib/csv/field-log-import.ts): every row checked as a shift recorded by hand is, against the plan, the log and
 * the file's other rows; all stored in one transaction, or none with a 400 naming each line and column.
 */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "recordProgress");
  const { text } = await readCsvUpload(req);
  const plan = validateDefinition(scenario.definition);
  const existing = (await listProgress({ scenarioId })).map(toRule);
  const read = readFieldLogCsv(text, plan, existing, todayIn(plan.timeZone));
  if (read.problems.length) throw rowErrors(read.problems);
  if (read.shifts.length === 0) throw new AppError("bad_request", "The file has no shifts to load (every row is marked deleted).", [{ path: "file", message: "has no recorded shifts" }]);
  const imported = await createProgressEntries({ projectId: scenario.projectId, scenarioId, entries: read.shifts.map((s) => fieldsOf(s.entry)), userId: user.id });
  const dates = read.shifts.map((s) => s.entry.workDate).sort();
  return NextResponse.json({ imported, skippedDeleted: read.skippedDeleted, from: dates[0], to: dates.at(-1)! } satisfies ProgressImportAnswer, { status: 201 });
});
