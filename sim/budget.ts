/**
 * The work budget of one run, checked before any run starts (server run, re-forecast, a browser run and its
 * save, each variant of a plan search), so that no single scenario can occupy a machine for minutes. The time
 * limit of an engine job on the queue follows from the same units.
 *
 * Work units per iteration = packets × operations × (links + 1) + HORIZON_DAYS, where operations counts each
 * operation once per stage it works in (the engine schedules every stage operation over the stage's packets;
 * counting the whole deck for each over-counts a stage on part of it). The first term bounds the
 * engine's claims and precedence checks (each packet of each operation looks at its incoming links); the
 * second the weather days one iteration may draw. It over-counts links (measured: 9× the demo's links costs
 * 1.3× the time, not 9×), which errs on the safe side. Common practice, no published source.
 *
 * Budgets: the demo (84 packets, 7 operations, 6 links) costs 6,308 units per iteration, so 20,000
 * browser iterations are 126 million units and fit the browser budget of 150 million; the server computes at
 * most 5,000 iterations (31.5 million for the demo) within 40 million units, i.e. about ten seconds of one
 * core on the 2-core reference machine (from a measured 1.3 ms per demo iteration).
 */
import { HORIZON_DAYS } from "./calendar";
import type { FieldProblem } from "./schema";

/** A run computed in the user's browser (its workers), and its save. */
export const BROWSER_WORK_BUDGET = 150_000_000;
/** A run, re-forecast or search variant the server's engine workers compute. */
export const SERVER_WORK_BUDGET = 40_000_000;
/**
 * A whole plan search (every variant and the plan as saved): about ten minutes of one core at the measured
 * 4.8 million units a second, spread over every worker thread. Common practice, no published source.
 */
export const SEARCH_WORK_BUDGET = 3_000_000_000;

export type RunPlace = "browser" | "server";

export interface RunWork {
  packets: number;
  operations: number;
  links: number;
  perIteration: number;
  total: number;
}

type WorkInput = {
  deck: { lengthFt: number; packetFt: number };
  operations: readonly unknown[];
  links: readonly unknown[];
  /** Absent (a version-1 plan): one stage with every operation. */
  stages?: readonly { operations?: readonly unknown[] }[];
};

export function runWork(s: WorkInput, iterations: number): RunWork {
  const packets = Math.ceil(s.deck.lengthFt / s.deck.packetFt);
  const stages = s.stages?.length ? s.stages : [{}];
  const operations = stages.reduce((n, st) => n + (st.operations?.length ?? s.operations.length), 0);
  const links = s.links.length;
  const perIteration = packets * operations * (links + 1) + HORIZON_DAYS;
  return { packets, operations, links, perIteration, total: perIteration * iterations };
}

const n = (x: number) => Math.round(x).toLocaleString("en-US");
const budgetOf = (place: RunPlace) => (place === "server" ? SERVER_WORK_BUDGET : BROWSER_WORK_BUDGET);

/** The most iterations of this scenario that fit the budget of `place`. */
export function iterationsThatFit(s: WorkInput, place: RunPlace): number {
  return Math.floor(budgetOf(place) / runWork(s, 1).perIteration);
}

/** null when the run fits its budget; otherwise a problem on `iterations` saying which limit and by how much. */
export function budgetProblem(s: WorkInput, iterations: number, place: RunPlace): FieldProblem | null {
  const budget = budgetOf(place);
  const w = runWork(s, iterations);
  if (w.total <= budget) return null;
  const fits = iterationsThatFit(s, place);
  const where = place === "server" ? "a run the server computes" : "a run in the browser";
  return {
    path: "iterations",
    message:
      `this run needs ${n(w.total)} work units (${n(w.packets)} packets × ${w.operations} operations × ${w.links + 1} (links + 1) + ${n(HORIZON_DAYS)} weather days, ` +
      `× ${n(iterations)} iterations): ${(w.total / budget).toFixed(1)} times the limit of ${n(budget)} for ${where}. ` +
      (fits >= 10 ? `At most ${n(fits)} iterations fit; or use longer packets, fewer operations or fewer links.` : "Use longer packets, fewer operations or fewer links."),
  };
}

/**
 * null when a plan search of `plans` plans (its variants and the plan as saved) at `iterations` each fits: every
 * plan within the server's budget of one run, and all of them within the search budget. Otherwise a problem
 * on `spec.iterations`.
 */
export function searchBudgetProblem(s: WorkInput, iterations: number, plans: number): FieldProblem | null {
  const one = budgetProblem(s, iterations, "server");
  if (one) return { path: "spec.iterations", message: `each plan of the search is one run: ${one.message}` };
  const total = runWork(s, iterations).total * plans;
  if (total <= SEARCH_WORK_BUDGET) return null;
  return {
    path: "spec.iterations",
    message:
      `${n(plans)} plans × ${n(iterations)} iterations need ${n(total)} work units: ${(total / SEARCH_WORK_BUDGET).toFixed(1)} times the limit of ` +
      `${n(SEARCH_WORK_BUDGET)} for one search. Use fewer variants or fewer iterations.`,
  };
}

/**
 * The time limit of an engine job of `units` work units: the units at a deliberately slow rate (a twentieth
 * of the measured 4.8 million a second), so a busy shared machine does not cut a legitimate job short while a
 * runaway one still ends. Between one and fifteen minutes. Common practice, no published source.
 */
const SLOW_UNITS_PER_SECOND = 240_000;
const MIN_TIME_LIMIT_SECONDS = 60;
const MAX_TIME_LIMIT_SECONDS = 900;

export function timeLimitSeconds(units: number): number {
  return Math.min(MAX_TIME_LIMIT_SECONDS, Math.max(MIN_TIME_LIMIT_SECONDS, Math.ceil(60 + units / SLOW_UNITS_PER_SECOND)));
}
