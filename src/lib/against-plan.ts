/**
 * Progress to date against the plan: how far each crew operation had got in the plan run's median iteration — the
 * one its Outlook draws on the time–distance chart — by the end of the field log's last day, and on which day that
 * iteration got as far as the field has. One likely course of the work, not a promise: the finish-date percentiles
 * say how sure the plan is. Pure.
 *
 * Feet in a packet grow in proportion to worked time, its pauses (weather, nights, winter) adding none — the
 * time–distance chart's own reading of a trace (src/components/results/time-distance-series.ts).
 */
import { formatDayNumber, parseIsoDate } from "@sim/dates";
import type { PauseRecord, Trace } from "@sim/engine";
import type { Scenario } from "@sim/schema";
import { compileCalendar, firstIntervalAfter, type OpCalendar } from "@sim/calendar";
import { packetPieces } from "@/components/results/time-distance-series";

export interface PlanReference {
  trace: Trace;
  startDate: string;
  lengthFt: number;
  packetFt: number;
}

export interface AgainstPlan {
  /** Feet the plan's median iteration had done by the end of `toDate`. */
  plannedFt: number;
  /** The field's feet less the plan's: below zero, behind. */
  differenceFt: number;
  /** The day the plan's median iteration got as far as the field has (null: it never did, or nothing is done). */
  planReachedOn: string | null;
  /**
   * The operation's working days between that day and `toDate` (days its calendar lets it work: in season, on its
   * work days, not stood down), the measure a schedule slips by; null without a calendar or a day.
   */
  workDays: number | null;
}

/**
 * Shifts of an operation's calendar that it may work, counted as days: day d in (from, to] (day numbers from the
 * plan's start) counts when one of its shifts that starts that day has working time (in season, inside its closure
 * window, not stood down). A night shift that runs past midnight is the day it starts; three shifts round the clock
 * are one day, not a stretch of merged hours.
 */
export function workingDays(cal: Pick<OpCalendar, "open" | "shifts">, from: number, to: number): number {
  const { shifts, open } = cal;
  const last = Math.min(to, shifts.dayIndex.length - 2);
  let n = 0;
  for (let d = Math.max(from + 1, 0); d <= last; d++) {
    for (let i = shifts.dayIndex[d]; i < shifts.length && shifts.starts[i] < 24 * (d + 1); i++) {
      if (shifts.starts[i] < 24 * d) continue; // began the day before
      const j = firstIntervalAfter(open, shifts.starts[i]);
      if (j < open.length && open.starts[j] < shifts.ends[i]) {
        n++;
        break;
      }
    }
  }
  return n;
}

/**
 * The plan run to compare with: its median iteration's trace, when the run was made of the plan as it stands (a run
 * of an earlier version drew another plan); null otherwise, or when it has no trace.
 */
export function planReference(run: { trace: unknown; stale: boolean } | null, plan: Scenario): PlanReference | null {
  if (!run || run.stale || !run.trace) return null;
  const trace = run.trace as Trace;
  // A stored trace another version wrote differently is no reference, rather than the project page's error (and the
  // forecast e-mail pass's, for every project).
  if (!Array.isArray(trace.packets) || !Array.isArray(trace.pauses)) return null;
  // Stored as JSON, an unfinished packet's finish is null: Infinity, as the engine had it.
  const finite = (v: number | null) => (v === null ? Infinity : v);
  return {
    trace: { packets: trace.packets.map((p) => ({ ...p, start: finite(p.start), finish: finite(p.finish) })), pauses: trace.pauses.map((p) => ({ ...p, end: finite(p.end) })) },
    startDate: plan.startDate,
    lengthFt: plan.deck.lengthFt,
    packetFt: plan.deck.packetFt,
  };
}

/** One operation's packets in the trace, each with its pauses and its length in feet. */
function packetsOf(ref: PlanReference, opId: string) {
  const pauses = new Map<string, PauseRecord[]>();
  for (const p of ref.trace.pauses) {
    if (p.op !== opId) continue;
    const key = `${p.stage ?? ""}|${p.packet}`;
    const list = pauses.get(key);
    if (list) list.push(p);
    else pauses.set(key, [p]);
  }
  return ref.trace.packets
    .filter((p) => p.op === opId && Number.isFinite(p.start) && Number.isFinite(p.finish))
    .map((p) => {
      const a = p.packet * ref.packetFt;
      const lengthFt = Math.max(0, Math.min(a + ref.packetFt, ref.lengthFt) - a);
      return { lengthFt, pieces: packetPieces(p, pauses.get(`${p.stage ?? ""}|${p.packet}`) ?? [], [0, lengthFt]).pieces, finish: p.finish };
    });
}

type Packets = ReturnType<typeof packetsOf>;

/** Feet done by hour `t` (hours since 00:00 of the plan's start). */
function feetBy(packets: Packets, t: number): number {
  let ft = 0;
  for (const p of packets) {
    if (t >= p.finish) {
      ft += p.lengthFt;
      continue;
    }
    for (const piece of p.pieces) {
      if (t >= piece.x1) ft += piece.y1 - piece.y0;
      else if (t > piece.x0) ft += ((piece.y1 - piece.y0) * (t - piece.x0)) / (piece.x1 - piece.x0);
    }
  }
  return ft;
}

/** The earliest hour by which `feet` are done (to a minute), or null when they never are. */
function hourReaching(packets: Packets, feet: number): number | null {
  const end = packets.reduce((m, p) => Math.max(m, p.finish), 0);
  if (feetBy(packets, end) < feet - 0.5) return null;
  let lo = 0;
  let hi = end;
  while (hi - lo > 1 / 60) {
    const mid = (lo + hi) / 2;
    if (feetBy(packets, mid) >= feet - 0.5) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * Each operation's standing against the plan at the end of `toDate` (`YYYY-MM-DD`). `calendarOf`: each operation's
 * compiled calendar, to count the working days between the field and the plan.
 */
export function againstPlan(rows: ReadonlyArray<{ id: string; doneFt: number }>, ref: PlanReference, toDate: string, calendarOf?: (opId: string) => OpCalendar | null): Map<string, AgainstPlan> {
  const start = parseIsoDate(ref.startDate);
  const today = parseIsoDate(toDate) - start;
  const out = new Map<string, AgainstPlan>();
  for (const r of rows) {
    const packets = packetsOf(ref, r.id);
    const plannedFt = feetBy(packets, (today + 1) * 24);
    const hour = r.doneFt > 0.5 ? hourReaching(packets, r.doneFt) : null;
    const reached = hour === null ? null : Math.floor(hour / 24);
    const iv = calendarOf?.(r.id) ?? null;
    const workDays = reached === null || !iv ? null : reached <= today ? workingDays(iv, reached, today) : workingDays(iv, today, reached);
    out.set(r.id, { plannedFt, differenceFt: r.doneFt - plannedFt, planReachedOn: reached === null ? null : formatDayNumber(start + reached), workDays });
  }
  return out;
}

const feet = (ft: number) => `${Math.round(ft).toLocaleString("en-US")} ft`;

/**
 * "400 ft behind — where the plan was on 20 Nov 2026, 9 working days earlier"; "On plan"; "250 ft ahead — where the
 * plan gets on …, 3 working days later". Calendar days when the working days are not known.
 */
export function againstPlanText(a: AgainstPlan, toDate: string, doneFt: number, formatDate: (iso: string) => string): string {
  if (Math.abs(a.differenceFt) < 0.5) return "On plan";
  const days = a.workDays ?? (a.planReachedOn ? Math.abs(parseIsoDate(toDate) - parseIsoDate(a.planReachedOn)) : 0);
  const span = `${days} ${a.workDays === null ? "" : "working "}${days === 1 ? "day" : "days"}`;
  if (a.differenceFt < 0) {
    if (doneFt <= 0.5) return `${feet(-a.differenceFt)} behind — not started; the plan had begun`;
    return `${feet(-a.differenceFt)} behind — where the plan was on ${formatDate(a.planReachedOn!)}${days > 0 ? `, ${span} earlier` : ""}`;
  }
  if (!a.planReachedOn) return `${feet(a.differenceFt)} ahead — further than the plan got`;
  return `${feet(a.differenceFt)} ahead — where the plan gets on ${formatDate(a.planReachedOn)}${days > 0 ? `, ${span} later` : ""}`;
}

/** What "Against the plan" compares with, said under the table ("4 Dec 2026, 16:32"; "3 Dec 2026"). */
export function againstPlanNote(runLabel: string, toDateLabel: string): string {
  return `Against the plan: how far the plan run of ${runLabel} had got by the end of ${toDateLabel} in its median iteration (the one drawn on the Outlook's time–distance chart). One likely course of the work, not a promise: the finish-date percentiles say how sure the plan is.`;
}

/** Everything a page needs to show progress against the plan, or null when there is no current plan run to compare with. */
export function againstPlanFor(input: {
  rows: ReadonlyArray<{ id: string; doneFt: number }>;
  /** The newest plan run; `stale` (the data layer's rule): made of an earlier version of the plan. */
  run: { trace: unknown; stale: boolean; createdAt: Date } | null;
  plan: Scenario;
  toDate: string;
  formatDate: (iso: string) => string;
  formatDateTime: (d: Date) => string;
}) {
  const ref = planReference(input.run, input.plan);
  if (!ref || !input.run || !input.toDate) return null;
  const cal = compileCalendar(input.plan);
  const index = new Map(input.plan.operations.map((o, i) => [o.id, i]));
  const calendarOf = (id: string) => cal.ops[index.get(id) ?? -1] ?? null;
  return { byOperation: againstPlan(input.rows, ref, input.toDate, calendarOf), toDate: input.toDate, note: againstPlanNote(input.formatDateTime(input.run.createdAt), input.formatDate(input.toDate)) };
}

/**
 * The job against the plan in one sentence, for the project page and the forecast e-mail: how many operations are
 * behind, and the one furthest behind in its working days (feet when the days are not known). Null without rows.
 * "Against the plan at 4 Dec 2026: 4 of 6 operations behind; furthest, Cleanup and surface preparation: 2,400 ft
 * behind, where the plan was on 24 Jun 2026 (100 working days earlier)."
 */
export function againstPlanSentence(rows: ReadonlyArray<{ id: string; name: string; doneFt: number }>, byOperation: Map<string, AgainstPlan>, toDate: string, formatDate: (iso: string) => string): string | null {
  const judged = rows.flatMap((r) => {
    const a = byOperation.get(r.id);
    return a ? [{ r, a }] : [];
  });
  if (judged.length === 0) return null;
  const head = `Against the plan at ${formatDate(toDate)}:`;
  const behind = judged.filter((x) => x.a.differenceFt <= -0.5);
  if (behind.length === 0) return `${head} every operation on plan or ahead of it.`;
  const days = (x: (typeof behind)[number]) => x.a.workDays ?? -1;
  const worst = behind.reduce((m, x) => (days(x) > days(m) || (days(x) === days(m) && x.a.differenceFt < m.a.differenceFt) ? x : m));
  const ft = feet(-worst.a.differenceFt);
  const where =
    worst.r.doneFt <= 0.5
      ? `not started while the plan had ${feet(worst.a.plannedFt)} done`
      : `${ft} behind, where the plan was on ${formatDate(worst.a.planReachedOn!)}${worst.a.workDays ? ` (${worst.a.workDays} working ${worst.a.workDays === 1 ? "day" : "days"} earlier)` : ""}`;
  const count = behind.length === 1 ? `1 of ${judged.length} operations behind` : `${behind.length} of ${judged.length} operations behind`;
  return behind.length === 1 ? `${head} ${count}, ${worst.r.name}: ${where}.` : `${head} ${count}; furthest, ${worst.r.name}: ${where}.`;
}
