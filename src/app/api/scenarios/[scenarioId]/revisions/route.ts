import { NextResponse } from "next/server";
import { AppError, badRequest, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { getRevisionWithPrevious } from "@db/queries/scenarios";
import type { RevisionPairAnswer } from "@/lib/scenario-contract";

type Ctx = { params: Promise<{ scenarioId: string }> };

/**
 * `?version=N`: that saved version of the plan and the one before it, as stored — the plan editor's history shows
 * what a save changed by comparing the two in words (any member, as they read the plan).
 */
export const GET = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  const version = new URL(req.url).searchParams.get("version") ?? "";
  if (!/^[1-9]\d{0,8}$/.test(version)) throw badRequest([{ path: "version", message: "Version must be a whole number from 1" }]);
  const revision = await getRevisionWithPrevious({ scenarioId, version: Number(version) });
  if (!revision) throw new AppError("not_found", `This scenario has no version ${Number(version).toLocaleString("en-US")}.`);
  return NextResponse.json({ ...revision, savedAt: revision.savedAt.toISOString() } satisfies RevisionPairAnswer);
});
