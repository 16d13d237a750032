import "server-only";
/**
 * The two reads every open page repeats — a project's scenario list and a run with its results — as plain
 * functions of the request and the signed-in person. Their route handlers call them, and so does the server
 * beside Next (src/lib/server/fast-reads.ts), which answers these two GETs without Next's request pipeline:
 * one implementation, so both ways give the same answer, checks included.
 */
import { AppError } from "./errors";
import { isUuid, requireProjectAs, requireRole } from "./access";
import { jsonWithEtag, type PlainAnswer, type ReadRequest } from "./http-cache";
import { storedRunAnswer } from "./stored-run-answer";
import { storedResultsFor } from "./run-results-cache";
import type { SignedIn } from "./session-token";
import type { ProjectRole } from "@/lib/permissions";
import type { RunHeadline } from "@/lib/run-record";
import type { ScenarioListAnswer } from "@/lib/scenario-list-contract";
import { getRunToServe } from "@db/queries/runs";
import { listProjectScenarios } from "@db/queries/scenarios";

/** GET /api/projects/:projectId/scenarios — with an ETag of the list; 304 only after the membership check. */
export async function scenarioListAnswer(request: ReadRequest, projectId: string, s: SignedIn): Promise<PlainAnswer> {
  await requireProjectAs(s, projectId, "read");
  const rows = await listProjectScenarios({ projectId });
  const answer: ScenarioListAnswer = {
    scenarios: rows.map((r) => ({
      ...r,
      createdAt: r.createdAt.toISOString(),
      updatedAt: r.updatedAt.toISOString(),
      // The column holds what `headlineOf` (src/lib/run-record.ts) stored; the data layer cannot name that type.
      runSummary: r.runSummary as (RunHeadline & Record<string, unknown>) | null,
      // Null for a scenario never run or with no run waiting.
      runAt: r.runAt?.toISOString() ?? null,
      pendingRunAt: r.pendingRunAt?.toISOString() ?? null,
    })),
  };
  return jsonWithEtag(request, answer);
}

/**
 * GET /api/runs/:runId — the run with its full results: the stored copy of the results (never parsed or
 * serialised here; kept in memory once read), gzip when the client takes it, an ETag and 304 for a client that
 * already holds this version of the run.
 */
export async function runAnswer(request: ReadRequest, runId: string, s: SignedIn): Promise<PlainAnswer> {
  const run = isUuid(runId) ? await getRunToServe({ id: runId, userId: s.user.id }) : null;
  if (!run) throw new AppError("not_found", "No such run.");
  // Access before anything else, the ETag comparison included: a 304 would tell a stranger the run exists.
  requireRole(run.role as ProjectRole | null, "read", "No such run.");
  const stored = await storedResultsFor(runId, run.resultsEtag);
  if (!stored) throw new AppError("not_found", "No such run.");
  return storedRunAnswer(request, run.fields, stored);
}
