/**
 * The plain-language reading of a run summary. Contract: pure strings from a `RunSummary`, in the order
 * the results page shows them; a percentile reached only by iterations that hit the engine's horizon
 * ("unfinished") is said in words, never shown as a date.
 */
import type { RunSummary } from "@sim/summary";
import type { Scenario } from "@sim/schema";
import { formatIsoDate, formatPercent } from "@/lib/format";
import { stageLabel } from "@/lib/stage-text";

/**
 * A run is called stable when the P80 of its two halves differs by at most this many days. Our own
 * planning tolerance (common practice, no published source): a schedule is read to the day, and two days
 * is inside the week-level precision a deck closure is booked at.
 */
export const STABLE_DAYS = 2;

/** A finish percentile as text: "14 Oct 2027", or a plain phrase when iterations did not finish. */
export function quantileText(v: string): string {
  return v === "unfinished" ? "not reached within the six-year horizon" : formatIsoDate(v);
}

export function isUnfinished(v: string): boolean {
  return v === "unfinished";
}

export interface PlainSummary {
  /** The P80 date text (rendered with data-testid="p80-date"). */
  p80: string;
  /** After the P80: ", 62 % chance of meeting the 1 Oct 2027 target" — or "" with no target. */
  targetClause: string;
  /** "P50 3 Oct 2027 · P80 … · P90 …" */
  percentiles: string;
  season1: string | null;
  unfinished: string | null;
  convergence: { stable: boolean | null; text: string };
  /** One line per stage when there are several: "Stage 1: North lane (L1): restored P50 … · P80 …". */
  stages: string[];
  /** Lane-closed hours over the whole job, or null for runs stored before the closure timeline. */
  laneClosed: string | null;
}

export function daysText(d: number): string {
  const r = Math.round(d * 10) / 10;
  return `${r.toLocaleString("en-US", { maximumFractionDigits: 1 })} ${r === 1 ? "day" : "days"}`;
}

export function plainSummary(s: RunSummary): PlainSummary {
  const targetClause = s.target
    ? `, ${formatPercent(s.target.probability)} chance of meeting the ${formatIsoDate(s.target.date)} target`
    : "";
  const percentiles = `P50 ${quantileText(s.finish.p50)} · P80 ${quantileText(s.finish.p80)} · P90 ${quantileText(s.finish.p90)}`;
  const season1 = s.season1End
    ? `Season 1 work ends around ${formatIsoDate(s.season1End.p50)} (median of the last production before the first winter).`
    : null;
  const unfinished =
    s.unfinishedIterations > 0
      ? s.unfinishedIterations === s.iterations
        ? `None of the ${s.iterations.toLocaleString("en-US")} iterations finished within the six-year horizon. Check the calendar: work days, shifts, closure windows and winter dates may leave too little open time.`
        : `${s.unfinishedIterations.toLocaleString("en-US")} of ${s.iterations.toLocaleString("en-US")} iterations (${formatPercent(s.unfinishedIterations / s.iterations)}) did not finish within the six-year horizon; percentiles they reach are shown as not reached.`
      : null;
  let convergence: PlainSummary["convergence"];
  if (s.convergenceDays === null) convergence = { stable: null, text: "Convergence could not be measured (too few iterations, or unfinished iterations in one half of the run)." };
  else if (s.convergenceDays <= STABLE_DAYS)
    convergence = { stable: true, text: `P80 moved ${daysText(s.convergenceDays)} between the two halves of the run — stable.` };
  else
    convergence = {
      stable: false,
      text: `P80 moved ${daysText(s.convergenceDays)} between the two halves of the run — run more iterations for a steadier P80.`,
    };
  const stages =
    (s.stages?.length ?? 0) > 1
      ? s.stages.map((st, i) => `${stageLabel(st.name, i)} (${st.lanes.join(", ")}): restored P50 ${quantileText(st.finish.p50)} · P80 ${quantileText(st.finish.p80)}`)
      : [];
  const hours = (x: number) => Math.round(x).toLocaleString("en-US");
  const laneClosed = s.laneClosedHours
    ? `Lane-closed hours: ${hours(s.laneClosedHours.total.p50)} P50 · ${hours(s.laneClosedHours.total.p80)} P80 (each closed lane counted every hour it is closed, nights and weekends behind barrier included).`
    : null;
  return { p80: quantileText(s.finish.p80), targetClause, percentiles, season1, unfinished, convergence, stages, laneClosed };
}

/** What P80 means, for a reader who does not schedule: one sentence under the headline. */
export function p80Meaning(s: RunSummary): string {
  if (isUnfinished(s.finish.p80)) return "P80 is the date by which 8 in 10 simulated outcomes finish; here fewer than 8 in 10 finish at all.";
  return `P80 means 8 in 10 of the ${s.iterations.toLocaleString("en-US")} simulated outcomes (weather, production rates, deterioration found) finish by ${formatIsoDate(s.finish.p80)}; 1 in 5 finish later.`;
}

/**
 * A single-season plan in words: the share of iterations that carry work over the first winter, read off the
 * confidence curve at the first winter's start. Null for a two-season plan (the winter is planned there).
 */
export function winterCarryover(s: RunSummary, plan: Scenario): string | null {
  if (plan.calendar.season.plan !== "single" || s.cdf.length === 0) return null;
  const y = Number(plan.startDate.slice(0, 4));
  const start = `${y}-${plan.calendar.season.winterStart}`;
  const winter = start > plan.startDate ? start : `${y + 1}-${plan.calendar.season.winterStart}`;
  // The curve's last point at or before the day before winter starts: the share finished before the stand-down.
  let done = 0;
  for (const pt of s.cdf) if (pt.date < winter) done = pt.p;
  const carried = 1 - done;
  if (carried < 0.005) return `Almost every iteration finishes before the winter stand-down of ${formatIsoDate(winter)}.`;
  return `In ${formatPercent(carried)} of the iterations the work is not finished by the winter stand-down (${formatIsoDate(winter)}) and carries over to the next season.`;
}

/**
 * The fewest iterations a printed brief should rest on. Our own rule (common practice, no published source):
 * with 1,000 iterations the 200 slowest outcomes lie beyond the P80; with a few hundred, a few dozen outcomes
 * decide the date the owner is told.
 */
export const BRIEF_MIN_ITERATIONS = 1_000;

/** What the brief says about how much its forecast rests on: the count always, a warning when too few or not stable. */
export function iterationsStatement(s: RunSummary): { text: string; warning: string | null } {
  const n = s.iterations.toLocaleString("en-US");
  const text = `This forecast rests on ${n} simulated outcomes (iterations).`;
  const c = plainSummary(s).convergence;
  const problems: string[] = [];
  if (s.iterations < BRIEF_MIN_ITERATIONS) problems.push(`${n} iterations are fewer than the ${BRIEF_MIN_ITERATIONS.toLocaleString("en-US")} a brief should rest on`);
  if (c.stable === false) problems.push(`it is not yet stable (the P80 moved ${daysText(s.convergenceDays ?? 0)} between the two halves of the run)`);
  if (c.stable === null) problems.push("its stability could not be measured");
  return { text, warning: problems.length ? `Not for decisions yet: ${problems.join(", and ")}. Run it again with more iterations before relying on these dates.` : null };
}
