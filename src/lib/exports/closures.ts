/**
 * The planned lane closures of a run, read off the closure timeline of its representative iteration
 * (MODEL.md, "Closures that stand"): one entry per period the timeline lists — a short-term closure stands
 * once per window interval its crews use (a night closure is that night, set-up and take-down included), a
 * stage's standing closure is one long period. Nothing is merged or stretched: what the delay model counts is
 * what the public is told. Later iterations may differ; the representative is the plan.
 */
import type { RunSummary } from "@sim/index";
import { formatHours, parseIsoDate } from "@sim/dates";

export interface PlannedClosure {
  closureId: string;
  name: string;
  kind: "short" | "standing";
  lanes: string[];
  /** Hours since 00:00 of the scenario's start date, local time (every day 24 h, as in the engine). */
  start: number;
  end: number;
}

/** `YYYY-MM-DDTHH:mm` (local) → hours since 00:00 of `startDate`. */
export function hoursSince(startDate: string, localIso: string): number {
  const days = parseIsoDate(localIso.slice(0, 10)) - parseIsoDate(startDate);
  return 24 * days + Number(localIso.slice(11, 13)) + Number(localIso.slice(14, 16)) / 60;
}

/**
 * The closures of the run, chronological (ties in timeline order), or null when the stored run predates the
 * closure timeline (it must be run again before anything is published from it).
 */
export function plannedClosures(summary: Pick<RunSummary, "startDate" | "representative">): PlannedClosure[] | null {
  const timeline = summary.representative.closureTimeline;
  if (!Array.isArray(timeline)) return null;
  return timeline
    .map((p) => ({ closureId: p.closure, name: p.name, kind: p.kind, lanes: p.lanes, start: hoursSince(summary.startDate, p.start), end: hoursSince(summary.startDate, p.end) }))
    .filter((c) => c.end > c.start && c.lanes.length > 0)
    .sort((a, b) => a.start - b.start);
}

/** Local wall-clock time → the UTC instant, for a named time zone (DST-correct through Intl). */
export function localToUtc(localIso: string, timeZone: string): Date {
  const [d, t] = localIso.split("T");
  const [y, m, day] = d.split("-").map(Number);
  const [hh, mm] = (t ?? "00:00").split(":").map(Number);
  const asUtc = Date.UTC(y, m - 1, day, hh, mm);
  const offsetAt = (instant: number) => {
    const parts = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit" }).formatToParts(new Date(instant));
    const get = (type: string) => Number(parts.find((p) => p.type === type)!.value);
    return Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute")) - instant;
  };
  let guess = asUtc - offsetAt(asUtc);
  guess = asUtc - offsetAt(guess);
  return new Date(guess);
}

export function closureLocalTimes(c: PlannedClosure, startDate: string) {
  const day0 = parseIsoDate(startDate);
  return { start: formatHours(day0, c.start), end: formatHours(day0, c.end) };
}

/** "Night two-lane closure (L2, L3 closed)" or, for a stage, "… (L1 behind barrier, round the clock)". */
export function closureLabel(c: Pick<PlannedClosure, "name" | "kind" | "lanes">): string {
  return c.kind === "standing" ? `${c.name}: ${c.lanes.join(", ")} closed round the clock` : `${c.name} (${c.lanes.join(", ")} closed)`;
}
