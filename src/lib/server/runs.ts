import "server-only";
import type { z } from "zod";
import { compileScenario, runIterations, summarizeRun, type RunSummary } from "@sim/index";
import { budgetProblem } from "@sim/budget";
import { saveRun } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { headlineOf, storedRun } from "@/lib/run-record";
import { MAX_SERVER_ITERATIONS, type runWriteSchema } from "@/lib/schemas";
import { AppError, badRequest } from "./errors";
import { validateDefinition } from "./scenario-input";
import { weatherFeasibility } from "@sim/feasibility";

type RunBody = z.output<typeof runWriteSchema>;

/**
 * A browser-computed summary is accepted only if it is what the engine would have produced: the server
 * re-simulates the representative iteration with the same seed and compares its finish and the headline
 * figures' shape. Same scenario + seed ⇒ the same numbers, so an honest client always passes.
 */
function checkClientSummary(compiled: ReturnType<typeof compileScenario>, body: RunBody, summary: RunSummary) {
  if (summary.iterations !== body.iterations) throw badRequest([{ path: "summary.iterations", message: "must equal iterations" }]);
  if (summary.seed !== body.seed) throw badRequest([{ path: "summary.seed", message: "must equal seed" }]);
  const k = summary.representative?.iteration;
  if (typeof k !== "number" || k < 0 || k >= body.iterations) throw badRequest([{ path: "summary.representative.iteration", message: "is missing or out of range" }]);
  const one = runIterations(compiled, body.seed, k, k + 1);
  const expected = one.finish[0];
  // An unfinished iteration's finish is Infinity, which JSON carries as null.
  const sent = summary.representative.finishHours ?? Infinity;
  const same = expected === Infinity ? sent === Infinity : Math.abs(expected - sent) <= 1e-6;
  if (!same) {
    throw badRequest([{ path: "summary", message: "does not match the engine's result for this scenario and seed; run it again" }], "The run does not match this scenario version.");
  }
}

export async function recordRun({ scenario, body, userId }: { scenario: ScenarioDetail; body: RunBody; userId: string }) {
  if (body.scenarioVersion !== undefined && body.scenarioVersion !== scenario.version) {
    throw new AppError("conflict", `The scenario was saved again (version ${scenario.version}) while this ran on version ${body.scenarioVersion}. Run it again.`);
  }
  const parsed = validateDefinition(scenario.definition);
  const never = weatherFeasibility(parsed);
  if (never.length) throw badRequest(never, "This plan can never finish; nothing was run.");
  if (!body.summary && body.iterations > MAX_SERVER_ITERATIONS) {
    throw badRequest([{ path: "iterations", message: `must be at most ${MAX_SERVER_ITERATIONS} when the server computes the run; larger runs go through the browser` }]);
  }
  // Checked before compiling: compiling itself is packets × links work.
  const overBudget = budgetProblem(parsed, body.iterations, body.summary ? "browser" : "server");
  if (overBudget) throw badRequest([overBudget], "The run is larger than the work budget; nothing was run or saved.");
  const compiled = compileScenario(parsed);
  const started = Date.now();
  let summary: RunSummary;
  if (body.summary) {
    summary = body.summary;
    checkClientSummary(compiled, body, summary);
  } else {
    summary = summarizeRun(compiled, runIterations(compiled, body.seed, 0, body.iterations));
  }
  const columns = storedRun({ definition: scenario.definition, seed: body.seed, iterations: body.iterations, summary, durationMs: body.durationMs ?? Date.now() - started });
  const row = await saveRun({ scenarioId: scenario.id, scenarioVersion: scenario.version, ...columns, userId });
  return { id: row.id, createdAt: row.createdAt, scenarioVersion: scenario.version, headline: headlineOf(summary) };
}
