import { NextResponse } from "next/server";
import { AppError, handler } from "@/lib/server/errors";
import { requireProgressEntry, validateEntry } from "@/lib/server/progress";
import { recordedFields, restoreProgressEntry } from "@db/queries/progress";

type Ctx = { params: Promise<{ entryId: string }> };

/**
 * Puts a deleted shift back in the log, as it was recorded, if the log still allows it (the same rules as recording
 * it: its stretch not recorded again since, not ahead of its predecessor); 400 naming the field otherwise, nothing
 * changed. No body. Those who record shifts may; 404 for an entry that is not deleted (or another project's).
 */
export const POST = handler(async (_req: Request, ctx: Ctx) => {
  const { entryId } = await ctx.params;
  const { entry, scenario, user } = await requireProgressEntry(entryId, "recordProgress", { deleted: true });
  await validateEntry({ scenario, entry: recordedFields(entry) });
  const result = await restoreProgressEntry({ id: entryId, userId: user.id });
  if (!result.ok) throw new AppError("not_found", "No deleted shift to put back.");
  return NextResponse.json({ version: result.version });
});
