/**
 * The work budget of an engine job: a size measure that grows with what the engine loops over — packets ×
 * operations × iterations — so one check covers a long deck, a long chain and many iterations alike.
 * MAX_WORK_UNITS is what the server accepts for one run (the main demo at 50,000 iterations is 29.4 M; at
 * about 3 M units per second per thread, the limit is some 20–60 s of one thread, not minutes).
 * The time limit of a job follows from its units at a deliberately slow rate, so a busy machine does not
 * cut a legitimate run short while a runaway one still ends.
 */
export const MAX_WORK_UNITS = 40_000_000;

/** Units per second assumed when setting a job's time limit: a thirtieth of the engine's speed on the demo (a shared, busy machine runs it ten times slower). */
const SLOW_UNITS_PER_SECOND = 100_000;
const MIN_TIME_LIMIT_SECONDS = 60;
const MAX_TIME_LIMIT_SECONDS = 900;

interface Sized {
  deck: { lengthFt: number; packetFt?: number };
  operations: readonly unknown[];
}

export function packetCount(s: Sized): number {
  const packetFt = s.deck.packetFt && s.deck.packetFt > 0 ? s.deck.packetFt : 100;
  return Math.max(1, Math.ceil(s.deck.lengthFt / packetFt));
}

export function workUnits(s: Sized, iterations: number): number {
  return packetCount(s) * Math.max(1, s.operations.length) * Math.max(0, iterations);
}

export function withinBudget(s: Sized, iterations: number): boolean {
  return workUnits(s, iterations) <= MAX_WORK_UNITS;
}

/** The largest iteration count that stays inside the budget for this scenario. */
export function maxIterationsFor(s: Sized): number {
  return Math.floor(MAX_WORK_UNITS / workUnits(s, 1));
}

export function timeLimitSeconds(units: number): number {
  return Math.min(MAX_TIME_LIMIT_SECONDS, Math.max(MIN_TIME_LIMIT_SECONDS, Math.ceil(60 + units / SLOW_UNITS_PER_SECOND)));
}

/** A plan search's whole budget (all variants together): some minutes of one thread at most. */
export const MAX_SEARCH_WORK_UNITS = 300_000_000;
