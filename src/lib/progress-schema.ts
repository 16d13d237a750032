/**
 * Field progress entries: the zod schema shared by the shift form and the route handlers, and the rules that
 * need the plan and the other entries (`checkProgressEntry`, `checkDependents`). Every problem names its field
 * path (`fromStationFt`, `discovered[0].toStationFt`) and says in words which field is wrong. "Today" is passed
 * in (the server uses its clock in the scenario's time zone; tests and the demo inject a date).
 */
import { z } from "zod";
import { coveredLength, unionRanges } from "@sim/asbuilt";
import { parseIsoDate } from "@sim/dates";
import type { FieldProblem, Scenario } from "@sim/schema";
import { plainText, realIsoDate } from "@sim/text";

export const DISCOVERED_KINDS = ["bottom-mat", "full-depth"] as const;
export const DISCOVERED_LABELS: Record<(typeof DISCOVERED_KINDS)[number], string> = {
  "bottom-mat": "Bottom-mat exposure",
  "full-depth": "Full-depth repair",
};

const isoDate = realIsoDate("Work date");
// zod 4 numbers refuse NaN and ±Infinity, so an empty number input (NaN) gets this message.
const num = (label: string) => z.number({ error: `${label} must be a number` });

export const discoveredItemSchema = z
  .object({
    kind: z.enum(DISCOVERED_KINDS, { error: "Condition must be bottom-mat exposure or full-depth repair" }),
    fromStationFt: num("Condition from station"),
    toStationFt: num("Condition to station"),
    areaSqFt: num("Condition area").gt(0, "Condition area must be more than 0 ft²").max(100_000, "Condition area must be at most 100,000 ft²"),
  })
  .superRefine((d, ctx) => {
    if (!(d.toStationFt > d.fromStationFt)) ctx.addIssue({ code: "custom", path: ["toStationFt"], message: "Condition to station must be after its from station" });
  });
export type DiscoveredInput = z.infer<typeof discoveredItemSchema>;

const entryObject = z.object({
    workDate: isoDate,
    shift: plainText(40, { label: "Shift" }).min(1, "Shift must be chosen"),
    operationId: plainText(40, { label: "Operation" }).min(1, "Operation must be chosen"),
    fromStationFt: num("From station"),
    toStationFt: num("To station"),
    crew: plainText(80, { label: "Crew" }).trim().default(""),
    tempF: num("Temperature").min(-40, "Temperature must be at least −40 °F").max(130, "Temperature must be at most 130 °F").nullable().default(null),
    rain: z.boolean().default(false),
    lostHours: num("Lost hours").min(0, "Lost hours must be between 0 and 24").max(24, "Lost hours must be between 0 and 24").default(0),
    lostReason: plainText(300, { multiline: true, label: "Reason for lost hours" }).trim().default(""),
    discovered: z.array(discoveredItemSchema).max(50, "At most 50 discovered conditions per shift").default([]),
});

function entryRules(e: { fromStationFt: number; toStationFt: number; lostHours: number; lostReason: string }, ctx: z.RefinementCtx) {
  if (!(e.toStationFt > e.fromStationFt)) ctx.addIssue({ code: "custom", path: ["toStationFt"], message: "To station must be after the from station" });
  if (e.lostHours > 0 && !e.lostReason) ctx.addIssue({ code: "custom", path: ["lostReason"], message: "Reason for lost hours must be given when hours were lost" });
}

export const progressEntrySchema = entryObject.superRefine(entryRules);
export type ProgressEntryInput = z.input<typeof progressEntrySchema>;
export type ProgressEntry = z.output<typeof progressEntrySchema>;

export const progressUpdateSchema = entryObject.extend({ version: z.number().int().min(1, "Version must be the version you loaded") }).superRefine(entryRules);

export const reforecastSchema = z.object({
  dataDate: realIsoDate("Data date"),
  seed: plainText(60, { label: "Seed" }).trim().min(1, "Seed must not be empty"),
  iterations: z.number().int("Iterations must be a whole number").min(10, "Iterations must be at least 10").max(5_000, "Iterations must be at most 5,000 (the server computes re-forecasts)"),
});

/** Today's date in a time zone, `YYYY-MM-DD` (UTC when the zone is unknown). */
export function todayIn(timeZone: string, now: Date = new Date()): string {
  const fmt = (tz: string) => new Intl.DateTimeFormat("en-CA", { timeZone: tz, year: "numeric", month: "2-digit", day: "2-digit" }).format(now);
  try {
    return fmt(timeZone);
  } catch {
    return fmt("UTC");
  }
}

const sta = (ft: number) => {
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
export function checkProgressEntry(args: { scenario: Scenario; entry: ProgressEntry; others: ReadonlyArray<RuleEntry>; today: string; id?: string }): FieldProblem[] {
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
