import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, badRequest, handler } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { parseCompareIds, type CompareAnswer, type CompareScenario } from "@/lib/compare-contract";
import { listCompareScenarios } from "@db/queries/compare";

const uuid = z.uuid();

/**
 * GET ?ids=a,b,c → each scenario (in the order asked) with its latest plan run's compare figures, or `run: null`,
 * and its newest re-forecast's headline, or `reforecast: null`.
 * 1–4 distinct ids (400 naming `ids` otherwise); every id must be a scenario of this project (404 otherwise,
 * without saying which exist elsewhere).
 */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ projectId: string }> }) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "read");
  const parsed = parseCompareIds(new URL(req.url).searchParams.get("ids"));
  if (!parsed.ok) throw badRequest([{ path: "ids", message: parsed.message }], "Choose one to four scenarios to compare.");
  if (!parsed.ids.every((id) => uuid.safeParse(id).success)) throw new AppError("not_found", "No such scenario in this project.");
  const rows = await listCompareScenarios({ projectId, ids: parsed.ids });
  const byId = new Map(rows.map((r) => [r.id, r]));
  if (!parsed.ids.every((id) => byId.has(id))) throw new AppError("not_found", "No such scenario in this project.");
  const out: CompareScenario[] = parsed.ids.map((id) => {
    const r = byId.get(id)!;
    const s = r.slice;
    return {
      id: r.id,
      name: r.name,
      version: r.version,
      run:
        r.runId && s
          ? {
              id: r.runId,
              scenarioVersion: r.runVersion!,
              stale: !!r.runStale,
              olderRules: !!r.runOlderRules,
              verification: r.runVerification!,
              iterations: r.iterations!,
              createdAt: new Date(r.runAt!).toISOString(),
              startDate: s.startDate,
              unfinishedIterations: s.unfinishedIterations ?? 0,
              finish: s.finish,
              finishAt: s.finishAt,
              cdf: s.cdf ?? [],
              target: s.target ?? null,
              weatherLostShifts: s.weatherLostShifts,
              // Lane-closed hours (P50); runs stored before the closure timeline carry crew closure hours instead.
              closureHoursTotal: s.laneClosedP50 ?? Object.values(s.totalByClosure ?? {}).reduce((a, b) => a + Number(b), 0),
              delay: s.delay ?? null,
              cost: s.cost ?? null,
            }
          : null,
      reforecast:
        r.reforecastDataDate && r.reforecastAt && r.reforecastP50 && r.reforecastP80
          ? {
              dataDate: r.reforecastDataDate,
              createdAt: r.reforecastAt.toISOString(),
              p50: r.reforecastP50,
              p80: r.reforecastP80,
              targetDate: r.reforecastTargetDate,
              targetProbability: r.reforecastTargetProbability,
              stale: !!r.reforecastStale,
              olderRules: !!r.reforecastOlderRules,
            }
          : null,
    };
  });
  return NextResponse.json({ scenarios: out } satisfies CompareAnswer);
});
