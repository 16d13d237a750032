/**
 * The plans worth choosing: a plan is on the frontier when no other plan is at least as good on every
 * objective and strictly better on one (all objectives are minimised). Sorting the points lexicographically
 * first means a point's dominators all come before it, and a point dominated by a dominated point is also
 * dominated by a frontier point (dominance is transitive), so each point is compared with the frontier so
 * far only.
 */
import { parseIsoDate } from "./dates";

export type Objectives = readonly number[];

/** a dominates b: no worse on every objective and better on at least one. NaN counts as worst. */
export function dominates(a: Objectives, b: Objectives): boolean {
  let better = false;
  for (let i = 0; i < a.length; i++) {
    const x = Number.isNaN(a[i]) ? Infinity : a[i];
    const y = Number.isNaN(b[i]) ? Infinity : b[i];
    if (x > y) return false;
    if (x < y) better = true;
  }
  return better;
}

function lexCompare(a: Objectives, b: Objectives): number {
  for (let i = 0; i < a.length; i++) {
    const x = Number.isNaN(a[i]) ? Infinity : a[i];
    const y = Number.isNaN(b[i]) ? Infinity : b[i];
    if (x !== y) return x < y ? -1 : 1;
  }
  return 0;
}

/** For each point, whether it is non-dominated within `points`. */
export function nonDominated(points: readonly Objectives[]): boolean[] {
  const order = points.map((_, i) => i).sort((i, j) => lexCompare(points[i], points[j]) || i - j);
  const front: number[] = [];
  const onFront = new Array<boolean>(points.length).fill(false);
  for (const i of order) {
    if (front.some((f) => dominates(points[f], points[i]))) continue;
    front.push(i);
    onFront[i] = true;
  }
  return onFront;
}

/** What a search compares for one plan, from its run summary's headline figures. */
export interface PlanOutcome {
  /** P80 finish date, or "unfinished". */
  p80Finish: string;
  /** Target probability, null without a target. */
  targetProbability: number | null;
  /** Median work-zone delay, vehicle-hours (null without a traffic model). */
  delayVehHours: number | null;
  /** Median contract cost, $ (null without costs). */
  contractCost: number | null;
}

/** The objectives of an outcome: P80 finish (day number; unfinished = ∞), delay, contract cost (missing = 0). */
export function objectivesOf(o: PlanOutcome): number[] {
  const finish = o.p80Finish === "unfinished" ? Infinity : parseIsoDate(o.p80Finish);
  return [finish, o.delayVehHours ?? 0, o.contractCost ?? 0];
}

interface SummaryLike {
  finish: { p80: string };
  target: { probability: number } | null;
  delay?: { vehicleHours: { p50: number | null } };
  cost?: { contract: { p50: number | null } | null };
}

export function outcomeOf(s: SummaryLike): PlanOutcome {
  const delay = s.delay?.vehicleHours.p50;
  const cost = s.cost?.contract?.p50;
  return {
    p80Finish: s.finish.p80,
    targetProbability: s.target?.probability ?? null,
    delayVehHours: delay === undefined || delay === null ? null : delay,
    contractCost: cost === undefined || cost === null ? null : cost,
  };
}
