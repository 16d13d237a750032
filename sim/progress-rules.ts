/**
 * The field-log rules that need the plan and the other entries, next to the as-built rules they feed
 * (`asbuilt.ts`): stations on the deck, not in the future, not before the plan starts, a stretch recorded once
 * per operation, not ahead of a predecessor (`checkProgressEntry`), and edits or deletes that would leave later work ahead of its
 * predecessor (`checkDependents`). Every problem names its field path (`fromStationFt`,
 * `discovered[0].toStationFt`) and says in words which field is wrong. "Today" is passed in (the server uses
 * its clock in the scenario's time zone; tests and the demo seed inject a date). Pure: used by the app's
 * route handlers (through `src/lib/progress-schema.ts`) and by the demo seed.
 */
import { coveredLength, unionRanges } from "./asbuilt";
import { parseIsoDate } from "./dates";
import type { FieldProblem, Scenario } from "./schema";

/** What the rules read of an entry (the zod-parsed form entry has these and more). */
export interface ProgressEntryFacts {
  workDate: string;
  shift: string;
  operationId: string;
  fromStationFt: number;
  toStationFt: number;
  discovered: ReadonlyArray<{ fromStationFt: number; toStationFt: number }>;
}

/** A station in feet as surveyors write it: 1250 → "STA 12+50". */
export const sta = (ft: number) => {
  const s = Math.floor(Math.abs(ft) / 100);
  const r = Math.abs(ft) - s * 100;
  return `STA ${ft < 0 ? "−" : ""}${s}+${r.toFixed(r % 1 === 0 ? 0 : 1).padStart(2, "0")}`;
};

/** An entry as the rules see it (stored rows and candidates alike). */
export interface RuleEntry {
  id?: string;
  workDate: string;
  shift: string;
  operationId: string;
  fromStationFt: number;
  toStationFt: number;
}

/** Crew operations that must have worked a station before `opId` may (through wait operations), with the lag. */
export function crewPredecessors(s: Scenario, opId: string): { id: string; lagFt: number }[] {
  const out = new Map<string, number>();
  const visit = (to: string, lag: number, depth: number) => {
    if (depth > s.operations.length) return;
    for (const l of s.links.filter((x) => x.to === to)) {
      const from = s.operations.find((o) => o.id === l.from);
      if (!from) continue;
      if (from.kind === "crew") out.set(from.id, Math.max(out.get(from.id) ?? 0, lag + l.lagFt));
      else visit(from.id, lag + l.lagFt, depth + 1);
    }
  };
  visit(opId, 0, 0);
  return [...out].map(([id, lagFt]) => ({ id, lagFt }));
}

function shiftStart(s: Scenario, e: RuleEntry): number {
  const sh = s.calendar.shifts.find((x) => x.id === e.shift);
  return 24 * (parseIsoDate(e.workDate) - parseIsoDate(s.startDate)) + (sh?.startHour ?? 0);
}

/** The predecessor problem of one entry against the others (same or earlier shifts), or null. */
function aheadProblem(s: Scenario, e: RuleEntry, others: ReadonlyArray<RuleEntry>): FieldProblem | null {
  const deckEnd = s.deck.startStationFt + s.deck.lengthFt;
  const t = shiftStart(s, e);
  const name = (id: string) => s.operations.find((o) => o.id === id)?.name ?? id;
  for (const pred of crewPredecessors(s, e.operationId)) {
    const union = unionRanges(
      others
        .filter((o) => o.id !== e.id && o.operationId === pred.id && shiftStart(s, o) <= t)
        .map((o) => [o.fromStationFt, o.toStationFt] as [number, number]),
    );
    const need = Math.min(e.toStationFt + pred.lagFt, deckEnd);
    if (coveredLength(union, e.fromStationFt, need) >= need - e.fromStationFt - 1e-6) continue;
    // The first station in [from, need) that the predecessor has not covered.
    let gap = e.fromStationFt;
    for (const [a, b] of union) if (a <= gap + 1e-6 && b > gap) gap = b;
    const lag = pred.lagFt > 0 ? ` (it must stay ${pred.lagFt} ft ahead)` : "";
    return {
      path: gap <= e.fromStationFt + 1e-6 ? "fromStationFt" : "toStationFt",
      message: `${name(e.operationId)} cannot be recorded ahead of ${name(pred.id)}: ${name(pred.id)} has no progress recorded by this shift at ${sta(gap)}${lag}`,
    };
  }
  return null;
}

/** Rules that need the plan: every problem with its field path. `others` = the scenario's other entries. */
export function checkProgressEntry(args: { scenario: Scenario; entry: ProgressEntryFacts; others: ReadonlyArray<RuleEntry>; today: string; id?: string }): FieldProblem[] {
  const { scenario: s, entry: e, today } = args;
  const out: FieldProblem[] = [];
  const lo = s.deck.startStationFt;
  const hi = lo + s.deck.lengthFt;
  if (e.workDate > today) out.push({ path: "workDate", message: `Work date must not be in the future (today is ${today})` });
  if (e.workDate < s.startDate) out.push({ path: "workDate", message: `Work date must not be before the plan starts (${s.startDate})` });
  if (!s.calendar.shifts.some((x) => x.id === e.shift)) out.push({ path: "shift", message: `Shift "${e.shift}" is not a shift of this plan` });
  const op = s.operations.find((o) => o.id === e.operationId);
  if (!op) out.push({ path: "operationId", message: `Operation "${e.operationId}" is not in this plan` });
  else if (op.kind !== "crew") out.push({ path: "operationId", message: `Operation "${op.name}" has no crew (it is a waiting time) and cannot be recorded` });
  if (e.fromStationFt < lo || e.fromStationFt >= hi) out.push({ path: "fromStationFt", message: `From station must be inside the deck (${sta(lo)} to ${sta(hi)})` });
  if (e.toStationFt > hi || e.toStationFt <= lo) out.push({ path: "toStationFt", message: `To station must be inside the deck (${sta(lo)} to ${sta(hi)})` });
  e.discovered.forEach((d, i) => {
    if (d.fromStationFt < e.fromStationFt || d.fromStationFt >= e.toStationFt)
      out.push({ path: `discovered[${i}].fromStationFt`, message: `Condition from station must be inside this shift's range (${sta(e.fromStationFt)} to ${sta(e.toStationFt)})` });
    if (d.toStationFt > e.toStationFt || d.toStationFt <= e.fromStationFt)
      out.push({ path: `discovered[${i}].toStationFt`, message: `Condition to station must be inside this shift's range (${sta(e.fromStationFt)} to ${sta(e.toStationFt)})` });
  });
  if (out.length === 0 && op) {
    // A stretch is built once: a second record of it would count the same work twice in the as-built deck.
    const twice = args.others.find((o) => o.id !== args.id && o.operationId === e.operationId && Math.min(o.toStationFt, e.toStationFt) - Math.max(o.fromStationFt, e.fromStationFt) > 1e-6);
    if (twice) {
      out.push({
        path: "fromStationFt",
        message: `${op.name} is already recorded over ${sta(twice.fromStationFt)}–${sta(twice.toStationFt)} (${twice.workDate}, ${twice.shift} shift): record only the stretch not yet done, or edit that entry`,
      });
      return out;
    }
    const p = aheadProblem(s, { ...e, id: args.id }, args.others);
    if (p) out.push(p);
  }
  return out;
}

/**
 * After an edit or a delete, entries of later operations that were in order before and no longer are.
 * `before` and `after` are the scenario's entries around the change.
 */
export function checkDependents(s: Scenario, before: ReadonlyArray<RuleEntry>, after: ReadonlyArray<RuleEntry>): FieldProblem[] {
  const out: FieldProblem[] = [];
  const name = (id: string) => s.operations.find((o) => o.id === id)?.name ?? id;
  for (const e of after) {
    const was = before.find((b) => b.id === e.id);
    if (!was || aheadProblem(s, was, before)) continue;
    const now = aheadProblem(s, e, after);
    if (now) out.push({ path: "(entry)", message: `This change would leave the ${name(e.operationId)} entry of ${e.workDate} (${e.shift}, ${sta(e.fromStationFt)}–${sta(e.toStationFt)}) ahead of its predecessor` });
  }
  return out;
}

/** A station typed as feet ("1250", "1,250.5") or in station notation ("12+50", "STA 12+50.5"); null otherwise. */
export function parseStation(raw: string): number | null {
  const s = raw.trim().replace(/^sta\.?\s*/i, "");
  const m = /^(-?\d+)\+(\d{1,2}(?:\.\d+)?)$/.exec(s);
  if (m) return (m[1].startsWith("-") ? -1 : 1) * (Math.abs(Number(m[1])) * 100 + Number(m[2]));
  if (/^-?(\d{1,3}(,\d{3})+|\d+)(\.\d+)?$/.test(s)) return Number(s.replace(/,/g, ""));
  return null;
}
