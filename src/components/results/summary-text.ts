/**
 * The plain-language reading of a run summary. Contract: pure strings from a `RunSummary`, in the order
 * the results page shows them; a percentile reached only by iterations that hit the engine's horizon
 * ("unfinished") is said in words, never shown as a date.
 */
import type { RunSummary } from "@sim/summary";
import type { Scenario } from "@sim/schema";
import { formatIsoDate, formatPercent } from "@/lib/format";

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
  return { p80: quantileText(s.finish.p80), targetClause, percentiles, season1, unfinished, convergence };
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
