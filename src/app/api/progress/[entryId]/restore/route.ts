import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateEntry } from "@/lib/server/progress";
import { getProgressEntry, recordedFields, restoreProgressEntry } from "@db/queries/progress";

type Ctx = { params: Promise<{ entryId: string }> };

/**
 * Puts a deleted shift back in the log, as it was recorded, if the log still allows it (the same rules as recording
 * it: its stretch not recorded again since, not ahead of its predecessor); 400 naming the field otherwise, nothing
 * changed. No body. Those who record shifts may; 404 for an entry that is not deleted (or another project's).
 */
export const POST = handler(async (_req: Request, ctx: Ctx) => {
  const { entryId } = await ctx.params;
  const entry = z.uuid().safeParse(entryId).success ? await getProgressEntry({ id: entryId, deleted: true }) : null;
  if (!entry || !entry.scenarioId) throw new AppError("not_found", "No deleted shift to put back.");
  const { scenario, user } = await requireScenario(entry.scenarioId, "recordProgress");
  await validateEntry({ scenario, entry: recordedFields(entry) });
  const result = await restoreProgressEntry({ id: entryId, userId: user.id });
  if (!result.ok) throw new AppError("not_found", "No deleted shift to put back.");
  return NextResponse.json({ version: result.version });
});
