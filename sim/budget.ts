/**
 * The work budget of one run, checked before any run starts (server run, re-forecast, a browser run and its
 * save, each variant of a plan search), so that no single scenario can occupy a machine for minutes. The time
 * limit of an engine job on the queue follows from the same units.
 *
 * Work units per iteration = packets × operations × 7 + HORIZON_DAYS, where operations counts each operation
 * once per stage it works in (the engine schedules every stage operation over the stage's packets; counting
 * the whole deck for each over-counts a stage on part of it). The first term is the engine's work on each
 * packet of each operation (its claim, precedence checks, gates and bookkeeping); the second the weather days
 * one iteration may draw. Measured on the 2-core reference machine (3 Dec 2026, V8 defaults): a packet of an
 * operation costs 0.5–0.9 µs, several weather days' worth, and the weight 7 keeps the demo's units (and the
 * budgets below, set on them) as they were. Links are not counted: from 0 to 21 links on the demo the time per
 * iteration stayed within the machine's noise (0.30–0.50 ms), and counting them as a factor (links + 1), as
 * this budget once did, made a plan without links look seven times cheaper than it is (a 50,000-ft deck
 * without links ran 2.7–4 ms per iteration on fewer units than the demo's 0.3–0.65 ms). Common practice, no
 * published source.
 *
 * Budgets: the demo (84 packets, 7 operations) costs 6,308 units per iteration, so 20,000 browser iterations
 * are 126 million units and fit the browser budget of 150 million; the server computes at most 5,000
 * iterations (31.5 million for the demo) within 40 million units: a few seconds of one core on the reference
 * machine (the demo runs 1,500–3,900 iterations a second there, depending on V8's settings and the machine's
 * load), and under 6 s for the slowest plan per unit measured (that long deck without links).
 */
import { HORIZON_DAYS } from "./calendar";
import type { FieldProblem } from "./schema";

/** Work units of one packet of one operation (see above). */
export const UNITS_PER_PACKET_OPERATION = 7;

/** A run computed in the user's browser (its workers), and its save. */
export const BROWSER_WORK_BUDGET = 150_000_000;
/** A run, re-forecast or search variant the server's engine workers compute. */
export const SERVER_WORK_BUDGET = 40_000_000;
/**
 * A whole plan search (every variant and the plan as saved): two to seven minutes of one core at the 7–25
 * million units a second measured (the slowest plan per unit, then the demo), spread over every worker
 * thread. Common practice, no published source.
 */
export const SEARCH_WORK_BUDGET = 3_000_000_000;

export type RunPlace = "browser" | "server";

export interface RunWork {
  packets: number;
  operations: number;
  perIteration: number;
  total: number;
}

type WorkInput = {
  deck: { lengthFt: number; packetFt: number };
  operations: readonly unknown[];
  /** Absent (a version-1 plan): one stage with every operation. */
  stages?: readonly { operations?: readonly unknown[] }[];
};

export function runWork(s: WorkInput, iterations: number): RunWork {
  const packets = Math.ceil(s.deck.lengthFt / s.deck.packetFt);
  const stages = s.stages?.length ? s.stages : [{}];
  const operations = stages.reduce((n, st) => n + (st.operations?.length ?? s.operations.length), 0);
  const perIteration = packets * operations * UNITS_PER_PACKET_OPERATION + HORIZON_DAYS;
  return { packets, operations, perIteration, total: perIteration * iterations };
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
      `this run needs ${n(w.total)} work units (${n(w.packets)} packets × ${w.operations} operations at ${UNITS_PER_PACKET_OPERATION} units each + ${n(HORIZON_DAYS)} weather days, ` +
      `× ${n(iterations)} iterations): ${(w.total / budget).toFixed(1)} times the limit of ${n(budget)} for ${where}. ` +
      (fits >= 10 ? `At most ${n(fits)} iterations fit; or use longer packets or fewer operations.` : "Use longer packets or fewer operations."),
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
 * The time limit of an engine job of `units` work units: the units at a deliberately slow rate (a thirtieth
 * of the slowest rate measured, about 7 million a second), so a busy shared machine does not cut a legitimate job short while a
 * runaway one still ends. Between one and fifteen minutes. Common practice, no published source.
 */
const SLOW_UNITS_PER_SECOND = 240_000;
const MIN_TIME_LIMIT_SECONDS = 60;
const MAX_TIME_LIMIT_SECONDS = 900;

export function timeLimitSeconds(units: number): number {
  return Math.min(MAX_TIME_LIMIT_SECONDS, Math.max(MIN_TIME_LIMIT_SECONDS, Math.ceil(60 + units / SLOW_UNITS_PER_SECOND)));
}
