/**
 * The daily look-ahead e-mail's words: the board as lines a person reads in any mail program, and what
 * changed since the last notice. Pure (no server, no clock), so it is tested directly.
 */
import type { CellStatus, LookAheadDay, NextOpenTime, OperationCell } from "@sim/lookahead";
import { formatIsoClock, formatIsoDate, formatIsoDay } from "./format";

export const STATUS_WORDS: Record<CellStatus, string> = {
  go: "may work",
  partial: "part of the shift",
  no: "blocked",
  unknown: "cannot tell",
  closed: "closed",
};
export const STATUS_MARKS: Record<CellStatus, string> = { go: "✓", partial: "◐", no: "✗", unknown: "?", closed: "–" };

/**
 * Slot start times (`YYYY-MM-DDTHH:mm`, ascending) as runs of consecutive hours: "2 Dec 07:00–17:00, 2 Dec 21:00–3 Dec 05:00".
 * A run ends at the end of its last slot.
 */
export function hourRanges(times: string[]): string {
  const ms = (t: string) => Date.UTC(+t.slice(0, 4), +t.slice(5, 7) - 1, +t.slice(8, 10), +t.slice(11, 13), +t.slice(14, 16));
  const label = (m: number, withDate: boolean) => {
    const iso = new Date(m).toISOString().slice(0, 16); // the local clock reading, carried in UTC fields
    return withDate ? formatIsoClock(iso, { year: false }) : iso.slice(11);
  };
  const runs: [number, number][] = [];
  for (const t of times) {
    const m = ms(t);
    const last = runs[runs.length - 1];
    if (last && m === last[1]) last[1] = m + 3_600_000;
    else runs.push([m, m + 3_600_000]);
  }
  return runs.map(([a, b]) => `${label(a, true)}–${label(b, new Date(a).getUTCDate() !== new Date(b).getUTCDate())}`).join(", ");
}

/** The board reduced to one status per (date, shift, operation), the part the next notice compares. */
export type CompactBoard = Record<string, CellStatus>;

const keyOf = (date: string, shiftId: string, opId: string) => `${date}|${shiftId}|${opId}`;

export function compactBoard(days: LookAheadDay[]): CompactBoard {
  const out: CompactBoard = {};
  for (const d of days) for (const s of d.shifts) for (const o of s.operations) out[keyOf(d.date, s.shiftId, o.operationId)] = o.status;
  return out;
}

export function cellWhy(o: OperationCell): string {
  if (o.status === "closed") return o.closedReason ?? "";
  if (o.failing.length === 0) return o.status === "unknown" ? "the forecast does not cover these hours" : "";
  return o.failing.map((f) => `${f.label.toLowerCase()} from ${f.at[0].slice(11)}`).join("; ");
}

/** Lines "Thu 8 Apr 2027, Day shift, Overlay placement: may work → blocked" for cells whose status changed. */
export function changesSince(previous: CompactBoard | null, days: LookAheadDay[]): string[] {
  if (!previous) return [];
  const lines: string[] = [];
  for (const d of days)
    for (const s of d.shifts)
      for (const o of s.operations) {
        const before = previous[keyOf(d.date, s.shiftId, o.operationId)];
        if (before && before !== o.status) lines.push(`${formatIsoDay(d.date)}, ${s.name}, ${o.name}: ${STATUS_WORDS[before]} → ${STATUS_WORDS[o.status]}`);
      }
  return lines;
}

export function boardLines(days: LookAheadDay[]): string[] {
  const lines: string[] = [];
  for (const d of days) {
    lines.push(formatIsoDay(d.date, { long: true }));
    for (const s of d.shifts)
      for (const o of s.operations) {
        const why = cellWhy(o);
        lines.push(`  ${STATUS_MARKS[o.status]} ${s.name} — ${o.name}: ${STATUS_WORDS[o.status]}${why ? ` (${why})` : ""}`);
      }
  }
  return lines;
}

/** The board has cells and every one is closed (winter, a plan not started yet): then the board points to the plan's next open time (sim/lookahead `nextOpenAfter`). */
export function everyCellClosed(days: LookAheadDay[]): boolean {
  const cells = days.flatMap((d) => d.shifts.flatMap((s) => s.operations));
  return cells.length > 0 && cells.every((c) => c.status === "closed");
}

/**
 * A week in which every cell is closed (winter, a plan not started yet) says so in one sentence, with why and
 * where the plan's calendar next opens; null when some cell is not closed (the board then speaks for itself).
 */
export function allClosedSentence(days: LookAheadDay[], next: NextOpenTime | null): string | null {
  if (!everyCellClosed(days)) return null;
  const cells = days.flatMap((d) => d.shifts.flatMap((s) => s.operations));
  const reasons = [...new Set(cells.map((c) => (c.closedReason ?? "").replace(/\.$/, "").toLowerCase()).filter(Boolean))];
  const why = `No shift on this board can work this week${reasons.length ? ` (${reasons.join("; ")})` : ""}.`;
  if (!next) return `${why} The plan's calendar has no open time left for a weather-gated operation.`;
  const starts = next.planStart ? ` The plan starts on ${formatIsoDate(next.planStart)}.` : "";
  const ops = next.operations; // `;` between them: operation names may hold commas
  const sameDay = ops.every((o) => o.start.slice(0, 10) === ops[0].start.slice(0, 10));
  const when = sameDay
    ? `on ${formatIsoDay(ops[0].start, { long: true })}: ${ops.map((o) => `${o.operation} from ${o.start.slice(11)}`).join("; ")}`
    : `for ${ops.map((o) => `${o.operation} on ${formatIsoDay(o.start, { long: true })} at ${o.start.slice(11)}`).join("; ")}`;
  return `${why}${starts} Its calendar next opens ${when} — weather permitting: the board judges each day once it is within the forecast's week.`;
}
