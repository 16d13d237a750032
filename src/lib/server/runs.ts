import "server-only";
/**
 * Storing and asking for runs. The web server never runs the engine: a run without a summary becomes an
 * engine job; a browser-computed summary is stored at once as "pending" and a verify job recomputes it (same
 * scenario version, seed and iterations ⇒ the same numbers) before it may count as the scenario's forecast.
 */
import type { z } from "zod";
import type { RunSummary } from "@sim/index";
import { saveRun } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { headlineOf, inputsHash } from "@/lib/run-record";
import { resultKey, type Computation } from "@/lib/run-keys";
import type { runWriteSchema } from "@/lib/schemas";
import { AppError, badRequest } from "./errors";
import { checkBudget, jobView, queueRunJob, queueVerifyJob } from "./jobs";
import { validateDefinition } from "./scenario-input";

type RunBody = z.output<typeof runWriteSchema>;

/** The figures lists show, read from a summary a browser sent; a body that is not a run summary is a 400. */
function headlineFrom(summary: Record<string, unknown>, body: RunBody) {
  if (summary.iterations !== body.iterations) throw badRequest([{ path: "summary.iterations", message: "must equal iterations" }]);
  if (summary.seed !== body.seed) throw badRequest([{ path: "summary.seed", message: "must equal seed" }]);
  try {
    return headlineOf(summary as unknown as RunSummary);
  } catch {
    throw badRequest([{ path: "summary", message: "is not a run summary (finish percentiles and weather figures are missing)" }]);
  }
}

export type RecordRunResult = { status: 201; body: Record<string, unknown> } | { status: 202; body: { job: ReturnType<typeof jobView> } };

export async function recordRun({ scenario, body, userId }: { scenario: ScenarioDetail; body: RunBody; userId: string }): Promise<RecordRunResult> {
  if (body.scenarioVersion !== undefined && body.scenarioVersion !== scenario.version) {
    throw new AppError("conflict", `The scenario was saved again (version ${scenario.version}) while this ran on version ${body.scenarioVersion}. Run it again.`);
  }
  const plan = validateDefinition(scenario.definition);
  const computation: Computation = { scenarioId: scenario.id, scenarioVersion: scenario.version, seed: body.seed, iterations: body.iterations };
  if (!body.summary) {
    const { job } = await queueRunJob({ plan, projectId: scenario.projectId, computation, userId });
    return { status: 202, body: { job: jobView(job) } };
  }
  // The server must be able to reproduce what it stores, so a browser run is held to the same budget.
  checkBudget(plan, body.iterations);
  const headline = headlineFrom(body.summary, body);
  const saved = await saveRun({
    scenarioId: scenario.id,
    scenarioVersion: scenario.version,
    inputsHash: inputsHash(scenario.definition, body.seed, body.iterations),
    seed: body.seed,
    iterations: body.iterations,
    summary: headline,
    results: body.summary,
    durationMs: body.durationMs ?? 0,
    userId,
    verification: "pending",
    resultKey: resultKey(computation),
  });
  let verifyJobId: string | null = null;
  if (saved.verification === "pending") {
    const { job } = await queueVerifyJob({ id: saved.id, projectId: scenario.projectId, scenarioId: scenario.id, scenarioVersion: scenario.version, seed: body.seed, iterations: body.iterations, createdById: userId }, plan);
    verifyJobId = job.id;
  }
  return { status: 201, body: { id: saved.id, createdAt: saved.createdAt, scenarioVersion: scenario.version, headline, verification: saved.verification, verifyJobId } };
}
