import { AppError, handler } from "@/lib/server/errors";
import { isUuid, requireRole, requireUser } from "@/lib/server/access";
import { storedRunResponse } from "@/lib/server/stored-run-response";
import { storedResultsFor } from "@/lib/server/run-results-cache";
import type { ProjectRole } from "@/lib/permissions";
import { getRunToServe } from "@db/queries/runs";

/**
 * A run with its full results: the stored copy of the results (never parsed or serialised here; kept in
 * memory once read), gzip when the client takes it, an ETag and 304 for a client that already holds this
 * version of the run.
 */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ runId: string }> }) => {
  const { runId } = await ctx.params;
  const { user } = await requireUser();
  const run = isUuid(runId) ? await getRunToServe({ id: runId, userId: user.id }) : null;
  if (!run) throw new AppError("not_found", "No such run.");
  // Access before anything else, the ETag comparison included: a 304 would tell a stranger the run exists.
  requireRole(run.role as ProjectRole | null, "read", "No such run.");
  const stored = await storedResultsFor(runId, run.resultsEtag);
  if (!stored) throw new AppError("not_found", "No such run.");
  return storedRunResponse(req, run.fields, stored);
});
