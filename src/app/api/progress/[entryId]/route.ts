import { NextResponse } from "next/server";
import { AppError, badRequest, handler, readJson } from "@/lib/server/errors";
import { fieldsOf, requireProgressEntry, validateDelete, validateEntry } from "@/lib/server/progress";
import { progressUpdateSchema } from "@/lib/progress-schema";
import { deleteProgressEntry, getProgressEntry, listProgressHistory, updateProgressEntry } from "@db/queries/progress";
import type { ProgressEntryAnswer } from "@/lib/progress-contract";

type Ctx = { params: Promise<{ entryId: string }> };

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { entryId } = await ctx.params;
  const { entry } = await requireProgressEntry(entryId, "read");
  const history = await listProgressHistory({ entryId });
  const answer: ProgressEntryAnswer = {
    entry: { ...entry, createdAt: entry.createdAt.toISOString(), updatedAt: entry.updatedAt.toISOString() },
    // The history columns are untyped JSON (db/schema.ts): what was stored is a record of the entry's fields, or null.
    history: history.map((h) => ({ ...h, changedAt: h.changedAt.toISOString(), before: h.before as Record<string, unknown> | null, after: h.after as Record<string, unknown> | null })),
  };
  return NextResponse.json(answer);
});

/** Saves only over the version the editor loaded (409 otherwise, nothing changes); history keeps before and after. */
export const PUT = handler(async (req: Request, ctx: Ctx) => {
  const { entryId } = await ctx.params;
  const { scenario, user } = await requireProgressEntry(entryId, "recordProgress");
  const { version, ...entry } = await readJson(req, progressUpdateSchema);
  await validateEntry({ scenario, entry, id: entryId });
  const result = await updateProgressEntry({ id: entryId, expectedVersion: version, fields: fieldsOf(entry), userId: user.id });
  if (!result.ok && result.reason === "missing") throw new AppError("not_found", "No such progress entry.");
  if (!result.ok) {
    const current = await getProgressEntry({ id: entryId });
    throw new AppError("conflict", `Someone else changed this entry (version ${result.currentVersion}) after you opened version ${version}. Nothing was overwritten.`, [], { current });
  }
  return NextResponse.json({ version: result.version });
});

/**
 * Takes the shift out of the log; it stays on record as deleted (who, when), with a history row. `?version=N`
 * (what the log showed) deletes only that version: 409 when someone corrected it since, nothing deleted.
 */
export const DELETE = handler(async (req: Request, ctx: Ctx) => {
  const { entryId } = await ctx.params;
  const raw = new URL(req.url).searchParams.get("version");
  if (raw !== null && !/^[1-9]\d{0,8}$/.test(raw)) throw badRequest([{ path: "version", message: "Version must be a whole number from 1" }]);
  const { scenario, user } = await requireProgressEntry(entryId, "recordProgress");
  await validateDelete({ scenario, id: entryId });
  const expectedVersion = raw === null ? undefined : Number(raw);
  const result = await deleteProgressEntry({ id: entryId, userId: user.id, expectedVersion });
  if (!result.ok && result.reason === "missing") throw new AppError("not_found", "No such progress entry.");
  if (!result.ok) {
    const current = await getProgressEntry({ id: entryId });
    throw new AppError("conflict", `Someone else changed this entry (version ${result.currentVersion}) after you opened version ${expectedVersion}. Nothing was deleted.`, [], { current });
  }
  return NextResponse.json({ ok: true });
});
