/**
 * Plain words for the closure-hours advisor (sim/advisor.ts), shared by the plan editor, the results and the
 * public advisory: clock times, day kinds, the warning a planned window earns and the runs of good start hours.
 */
import type { ClosureAdvice } from "@sim/advisor";
import { describeQueueLimit, type QueueLimit } from "@sim/queue-limit";
import type { DemandKind } from "@sim/traffic";

export const DAY_KIND_LABEL: Record<DemandKind, string> = {
  weekday: "Monday to Thursday",
  friday: "Fridays",
  saturday: "Saturdays",
  sunday: "Sundays",
  holidayPeak: "holiday-weekend days",
};

/** 15.5 → "15:30"; 24 and 0 → "00:00". */
export function clock(h: number): string {
  const m = Math.round((((h % 24) + 24) % 24) * 60);
  return `${String(Math.floor(m / 60)).padStart(2, "0")}:${String(m % 60).padStart(2, "0")}`;
}

export function windowLabel(w: { start: number; end: number }, kind: "short" | "standing" = "short"): string {
  return kind === "standing" ? "round the clock" : `${clock(w.start)}–${clock(w.end)}`;
}

const mi = (x: number) => x.toLocaleString("en-US", { maximumFractionDigits: 1, minimumFractionDigits: x < 10 ? 1 : 0 });

/** The warning for a planned window that lets the queue pass the limit, or null when it keeps under it. */
export function breachWarning(a: ClosureAdvice, limit: QueueLimit): string | null {
  const p = a.planned;
  if (!p || !p.breaks) return null;
  const when = a.kind === "standing" ? "standing round the clock" : `open ${p.windows.map((w) => windowLabel(w)).join(" and ")}`;
  const minutes = Number.isFinite(p.peakDelayMinutes) ? `${Math.round(p.peakDelayMinutes)} minutes of delay` : "no way through";
  return `${a.name} on ${DAY_KIND_LABEL[a.dayKind]}, ${when}: the queue reaches ${mi(p.peakQueueMiles)} mi (${Math.round(p.peakQueueVeh).toLocaleString("en-US")} vehicles, ${minutes}) around ${clock(p.peakHour)} — over the limit of ${describeQueueLimit(limit)}.`;
}


/**
 * Runs of start hours from which a closure of at least `hours` keeps the queue under the limit, e.g.
 * ["19:00–05:00"] (a run through midnight is one run). [] when no hour qualifies; ["any hour"] when all do.
 */
export function goodStartRuns(a: ClosureAdvice, hours: number): string[] {
  const ok = a.hours.map((h) => h.longestClosureFrom >= hours);
  if (ok.every(Boolean)) return ["any hour"];
  if (!ok.some(Boolean)) return [];
  const first = ok.findIndex((x) => !x); // start scanning after a bad hour so a run through midnight stays whole
  const runs: string[] = [];
  let runStart = -1;
  for (let i = 1; i <= 24; i++) {
    const h = (first + i) % 24;
    if (ok[h] && runStart < 0) runStart = h;
    if ((!ok[h] || i === 24) && runStart >= 0) {
      const last = ok[h] ? h : (h + 23) % 24;
      runs.push(runStart === last ? clock(runStart) : `${clock(runStart)}–${clock(last)}`);
      runStart = -1;
    }
  }
  return runs;
}
