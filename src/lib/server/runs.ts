import "server-only";
/**
 * Storing and asking for runs. The web server never runs the engine: a run without a summary becomes an
 * engine job; a browser-computed summary (the strict run-result contract) is stored at once as "pending" and
 * a verify job recomputes it (same scenario version, seed and iterations ⇒ the same numbers) before it may
 * count as the scenario's forecast.
 */
import type { z } from "zod";
import { budgetProblem } from "@sim/budget";
import { weatherFeasibility } from "@sim/feasibility";
import { saveRun } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { headlineOf, storedRun } from "@/lib/run-record";
import { resultKey, type Computation } from "@/lib/run-keys";
import { MAX_SERVER_ITERATIONS, type runWriteSchema } from "@/lib/schemas";
import type { JobAnswer } from "@/lib/job-contract";
import type { RunStoredAnswer } from "@/lib/run-contract";
import { AppError, badRequest } from "./errors";
import { jobView, queueRunJob, queueVerifyJob } from "./jobs";
import { validateDefinition } from "./scenario-input";

type RunBody = z.output<typeof runWriteSchema>;

export type RecordRunResult = { status: 201; body: RunStoredAnswer } | { status: 202; body: JobAnswer };

export async function recordRun({ scenario, body, userId }: { scenario: ScenarioDetail; body: RunBody; userId: string }): Promise<RecordRunResult> {
  if (body.scenarioVersion !== undefined && body.scenarioVersion !== scenario.version) {
    throw new AppError("conflict", `The scenario was saved again (version ${scenario.version}) while this ran on version ${body.scenarioVersion}. Run it again.`);
  }
  const plan = validateDefinition(scenario.definition);
  const never = weatherFeasibility(plan);
  if (never.length) throw badRequest(never, "This plan can never finish; nothing was run.");
  if (!body.summary && body.iterations > MAX_SERVER_ITERATIONS) {
    throw badRequest([{ path: "iterations", message: `must be at most ${MAX_SERVER_ITERATIONS} when the server computes the run; larger runs go through the browser` }]);
  }
  // A browser run is held to the browser's budget; its verification job then gets a time limit to match.
  const overBudget = budgetProblem(plan, body.iterations, body.summary ? "browser" : "server");
  if (overBudget) throw badRequest([overBudget], "The run is larger than the work budget; nothing was run or saved.");
  const computation: Computation = { scenarioId: scenario.id, scenarioVersion: scenario.version, seed: body.seed, iterations: body.iterations };
  if (!body.summary) {
    const { job } = await queueRunJob({ plan, projectId: scenario.projectId, computation, userId });
    return { status: 202, body: { job: jobView(job) } };
  }
  const summary = body.summary;
  if (summary.iterations !== body.iterations) throw badRequest([{ path: "summary.iterations", message: "must equal iterations" }]);
  if (summary.seed !== body.seed) throw badRequest([{ path: "summary.seed", message: "must equal seed" }]);
  const columns = storedRun({ definition: scenario.definition, seed: body.seed, iterations: body.iterations, summary, durationMs: body.durationMs ?? 0 });
  const saved = await saveRun({ scenarioId: scenario.id, scenarioVersion: scenario.version, ...columns, userId, verification: "pending", resultKey: resultKey(computation) });
  let verifyJobId: string | null = null;
  if (saved.verification === "pending") {
    const { job } = await queueVerifyJob({ id: saved.id, projectId: scenario.projectId, scenarioId: scenario.id, scenarioVersion: scenario.version, seed: body.seed, iterations: body.iterations, createdById: userId }, plan);
    verifyJobId = job.id;
  }
  return { status: 201, body: { id: saved.id, createdAt: saved.createdAt.toISOString(), scenarioVersion: scenario.version, headline: headlineOf(summary), verification: saved.verification, verifyJobId } };
}
