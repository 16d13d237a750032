import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { readShiftsFile } from "@/lib/server/progress-import";
import { importSummary } from "@/lib/csv/field-log-import";
import type { ProgressImportPreview } from "@/lib/progress-contract";

/**
 * Checks a field-log file as the import would (the same reading, the same refusals) and says what loading it would
 * add, operation by operation; stores nothing. Only those who may record shifts may check a file for the log.
 */
export const POST = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "recordProgress");
  const { plan, read } = await readShiftsFile(req, scenario);
  return NextResponse.json(importSummary(read, plan) satisfies ProgressImportPreview);
});
