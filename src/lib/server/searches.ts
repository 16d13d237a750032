import "server-only";
/**
 * Plan searches on the server: checking a spec against the plan and the budget, building the variants
 * (sim/search) and queuing them, and the view of a search with its frontier (sim/frontier).
 */
import { z } from "zod";
import { applyVariant, buildVariants, searchSpecSchema, specProblems, variantLabel, type SearchSpec } from "@sim/search";
import { stableStringify } from "@/lib/run-record";
import { nonDominated, objectivesOf } from "@sim/frontier";
import { runWork, searchBudgetProblem, timeLimitSeconds } from "@sim/budget";
import { weatherFeasibility } from "@sim/feasibility";
import type { ScenarioDetail } from "@db/queries/scenarios";
import type { SearchDetail } from "@db/queries/searches";
import type { listVariants } from "@db/queries/searches";
import { enqueueSearch } from "@workers/server/enqueue";
import { searchJobKey } from "@/lib/run-keys";
import { badRequest } from "./errors";
import { queue } from "./jobs";
import { validateDefinition } from "./scenario-input";
import { dataDateProblem, toRecord } from "./progress";
import { listProgress } from "@db/queries/progress";
import type { SearchAnswer, SharedSearchPlans } from "@/lib/search-contract";

export const searchWriteSchema = z.object({
  name: z.string().trim().min(1, "must not be empty").max(120),
  spec: searchSpecSchema,
});

export async function startSearch({ scenario, body, userId }: { scenario: ScenarioDetail; body: z.output<typeof searchWriteSchema>; userId: string }) {
  const plan = validateDefinition(scenario.definition);
  const never = weatherFeasibility(plan);
  if (never.length) throw badRequest(never, "This plan can never finish; no search was started.");
  const problems = specProblems(plan, body.spec);
  if (problems.length) throw badRequest(problems, "The search names things this plan does not have.");
  const from = body.spec.fromFieldLog;
  const wrongDate = from && dataDateProblem(plan, from.dataDate, "spec.fromFieldLog.dataDate");
  if (wrongDate) throw badRequest([wrongDate], "A search from the field log starts from a day the field log can describe; nothing was started.");
  // The field log as it stands now: every plan of the search starts from the same as-built state.
  const fieldLog = from ? (await listProgress({ scenarioId: scenario.id })).map(toRecord) : null;
  const built = buildVariants(body.spec);
  const runs = built.variants.length + 1; // the plan as saved runs too, as the reference point
  const overBudget = searchBudgetProblem(plan, body.spec.iterations, runs);
  if (overBudget) throw badRequest([overBudget], "The search is larger than the work budget; nothing was started.");
  const variants = [{ choice: null, label: "The plan as saved" }, ...built.variants.map((choice) => ({ choice, label: variantLabel(body.spec.dimensions, choice) }))];
  return enqueueSearch(
    await queue(),
    { projectId: scenario.projectId, scenarioId: scenario.id, scenarioVersion: scenario.version, name: body.name, spec: body.spec, method: built.method, gridSize: built.gridSize, fieldLog, userId },
    variants,
    { seed: body.spec.seed, iterations: body.spec.iterations, timeLimitSeconds: timeLimitSeconds(runWork(plan, body.spec.iterations).total), singletonKeyOf: searchJobKey },
  );
}

/**
 * For one search: the plan each variant makes of the version it varied, and whether that differs from it at all: one of a
 * dimension's levels is usually the plan's own, so a variant may choose exactly what the plan has (compared by
 * value, whatever order the keys were written in).
 */
export function variantPlans(base: unknown, dims: SearchSpec["dimensions"]) {
  const current = validateDefinition(base);
  const asIs = stableStringify(current); // once per search, not per variant: the page asks every 2 s while it runs
  return (choice: readonly number[]) => {
    const plan = applyVariant(current, dims, choice);
    return { plan, changes: stableStringify(plan) !== asIs };
  };
}

/**
 * A search as the page draws it: each finished plan with its objectives and whether it is on the frontier, and —
 * given the version it varied (`base`) — whether using it in the plan would change anything.
 */
export function searchView(search: SearchDetail, variants: Awaited<ReturnType<typeof listVariants>>, base: unknown = null): SearchAnswer {
  const done = variants.filter((v) => v.status === "done" && v.outcome);
  const front = nonDominated(done.map((v) => objectivesOf(v.outcome!)));
  const onFront = new Set(done.filter((_, i) => front[i]).map((v) => v.idx));
  const planOf = base !== null ? variantPlans(base, search.spec.dimensions) : null;
  return {
    search: { ...search, createdAt: search.createdAt.toISOString(), variantCount: variants.length - 1, fromFieldLog: search.spec.fromFieldLog ?? null },
    variants: variants.map((v) => ({ ...v, current: v.idx === 0, onFrontier: onFront.has(v.idx), changesPlan: !!planOf && v.choice !== null && planOf(v.choice).changes })),
  };
}

/**
 * A search as a share link shows it: the same plans and frontier marks, without ids that lead anywhere (no
 * job to follow or cancel, no scenario or project id, no variant choices to save as a scenario).
 */
export function publicSearchView(search: SearchDetail, variants: Awaited<ReturnType<typeof listVariants>>): SharedSearchPlans {
  const view = searchView(search, variants);
  const s = view.search;
  return {
    search: { name: s.name, method: s.method, gridSize: s.gridSize, variantCount: s.variantCount, scenarioVersion: s.scenarioVersion, stale: s.stale, olderRules: s.olderRules, createdAt: s.createdAt, createdByName: s.createdByName, jobStatus: s.jobStatus, fromFieldLog: s.fromFieldLog, fieldLogShifts: s.fieldLogShifts },
    variants: view.variants.map((v) => ({ idx: v.idx, label: v.label, status: v.status, outcome: v.outcome, problem: v.problem, current: v.current, onFrontier: v.onFrontier })),
  };
}
