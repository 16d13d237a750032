/**
 * The facts of the printed brief's traffic section, from a stored run and its plan (pure; nothing is
 * simulated): the closure plan — each closure of the representative iteration's closure timeline with its
 * planned hours, how often it stands and its lane-closed hours — the longest expected backups, and the days
 * whose longest queue broke the plan's queue limit (sim/queue-limit). The same sources as the results view.
 */
import type { RunSummary, TrafficDay } from "@sim/run-summary-schema";
import type { DayType, Scenario } from "@sim/schema";
import { daysOverLimit, queueLimitOf, type QueueLimit } from "@sim/queue-limit";
import { windowLabel } from "./closure-advice-text";

export interface ClosurePlanRow {
  closure: string;
  name: string;
  kind: "short" | "standing";
  lanes: string[];
  /** When it may stand, in words: the plan's windows of a short-term closure, "round the clock" for a stage's. */
  hours: string;
  /** Periods it stood in the representative iteration (nights, days; a stage's standing closure: usually one). */
  periods: number;
  /** First and last local date it stood, YYYY-MM-DD; null when it never stood. */
  first: string | null;
  last: string | null;
  /** Lane-closed hours, P50 over iterations; null when the run does not list the closure. */
  laneHoursP50: number | null;
}

const DAY_TYPE_WORDS: Record<DayType, string> = { weekday: "weekdays", saturday: "Saturdays", sunday: "Sundays", holiday: "holidays" };

function plannedHours(s: Scenario, closure: string): string {
  const windows = s.calendar.closureWindows.filter((w) => w.closure === closure);
  if (windows.length === 0) return "no window planned";
  return windows.map((w) => `${w.dayTypes.map((t) => DAY_TYPE_WORDS[t]).join(", ")} ${windowLabel({ start: w.startHour, end: w.endHour })}`).join("; ");
}

/** One row per closure of the timeline (short-term closures in calendar order, then each stage's standing closure). */
export function closurePlanRows(s: Scenario, summary: Pick<RunSummary, "representative" | "laneClosedHours">): ClosurePlanRow[] {
  const timeline = summary.representative.closureTimeline ?? [];
  const byClosure = summary.laneClosedHours?.byClosure ?? [];
  const ids = [...s.calendar.closures.map((c) => c.id), ...byClosure.filter((c) => c.kind === "standing").map((c) => c.closure)];
  const rows: ClosurePlanRow[] = [];
  for (const id of [...new Set(ids)]) {
    const periods = timeline.filter((p) => p.closure === id);
    const listed = byClosure.find((c) => c.closure === id);
    const short = s.calendar.closures.find((c) => c.id === id);
    if (!short && !listed) continue;
    const kind = short ? "short" : "standing";
    rows.push({
      closure: id,
      name: short?.name ?? listed!.name,
      kind,
      lanes: short?.lanesClosed ?? listed!.lanes,
      hours: kind === "standing" ? "round the clock while its stage is worked" : plannedHours(s, id),
      periods: periods.length,
      first: periods.length ? periods[0].start.slice(0, 10) : null,
      last: periods.length ? periods[periods.length - 1].end.slice(0, 10) : null,
      laneHoursP50: listed ? listed.p50 : null,
    });
  }
  return rows;
}

/** The `count` days with the longest queue, longest first (ties: earlier first); days without a queue are left out. */
export function longestBackups(summary: Pick<RunSummary, "traffic">, count = 5): TrafficDay[] {
  const days = summary.traffic?.days ?? [];
  return days
    .filter((d) => d.peakQueueMiles > 0)
    .slice()
    .sort((a, b) => b.peakQueueMiles - a.peakQueueMiles || a.date.localeCompare(b.date))
    .slice(0, count);
}

export interface LimitCheck {
  limit: QueueLimit;
  /** Days over the limit in date order; null when the limit is in minutes and the run kept no minutes. */
  days: TrafficDay[] | null;
}

/** The plan's queue limit and the representative iteration's days over it (null without a traffic model). */
export function limitCheck(s: Scenario, summary: Pick<RunSummary, "traffic">): LimitCheck | null {
  if (!summary.traffic) return null;
  const limit = queueLimitOf(s);
  return { limit, days: daysOverLimit(summary.traffic.days, limit) };
}
