/**
 * Whether the closures the public was told of still hold: the closure periods of a published forecast against the
 * newest forecast's, from today on. A newer forecast that moves no closure from today on (the same plan run again
 * with its seed, or a re-forecast that changed nothing ahead) does not make the public's notice out of date; one
 * that does is said in numbers and with the first day that differs, so whoever publishes knows what a new notice
 * would change.
 */
import { z } from "zod";
import { closurePeriodSchema, type ClosurePeriodSummary } from "@sim/run-summary-schema";
import { formatIsoDay } from "./format";

export type ClosureChanges = {
  /** Published periods from today on that the newest forecast does not have (moved, shortened, dropped). */
  gone: number;
  /** Periods from today on in the newest forecast that were not published (moved, new). */
  added: number;
  /** How many periods from today on were published. */
  published: number;
  /** The earliest local day ("YYYY-MM-DD") on which the two differ. */
  firstDay: string;
};

const timelineSchema = z.array(closurePeriodSchema);

/** A stored timeline as the run-result contract has it, or null (a run stored before timelines, or not one). */
export function closureTimeline(stored: unknown): ClosurePeriodSummary[] | null {
  const parsed = timelineSchema.safeParse(stored);
  return parsed.success ? parsed.data : null;
}

// A period is what a notice says of it: which closure, by name and kind, which lanes, from when to when.
const keyOf = (p: ClosurePeriodSummary) => JSON.stringify([p.closure, p.name, p.kind, [...p.lanes].sort(), p.start, p.end]);

/**
 * The periods of `published` and `newest` that still stand at the start of local day `today` ("YYYY-MM-DD"; a
 * period ending later than its midnight), compared as sets of what a notice says; null when they are the same.
 */
export function closureChanges(published: readonly ClosurePeriodSummary[], newest: readonly ClosurePeriodSummary[], today: string): ClosureChanges | null {
  const from = `${today}T00:00`;
  const ahead = (list: readonly ClosurePeriodSummary[]) => list.filter((p) => p.end > from);
  const before = ahead(published);
  const after = ahead(newest);
  const afterKeys = new Set(after.map(keyOf));
  const beforeKeys = new Set(before.map(keyOf));
  const gone = before.filter((p) => !afterKeys.has(keyOf(p)));
  const added = after.filter((p) => !beforeKeys.has(keyOf(p)));
  if (gone.length === 0 && added.length === 0) return null;
  // A period that began before today differs from today on: its first day then is today.
  const firstStart = [...gone, ...added].map((p) => (p.start < from ? from : p.start)).sort()[0];
  return { gone: gone.length, added: added.length, published: before.length, firstDay: firstStart.slice(0, 10) };
}

const closures = (n: number) => `${n.toLocaleString("en-US")} closure${n === 1 ? "" : "s"}`;

/** The changes in one sentence, for the Share page, the project page and the forecast e-mail. */
export function closureChangesText(c: ClosureChanges): string {
  const first = `the first difference is on ${formatIsoDay(c.firstDay)}`;
  const gone = `${c.gone.toLocaleString("en-US")} of the ${closures(c.published)} published from today on ${c.gone === 1 ? "is" : "are"} not in the newest forecast`;
  const added = `${closures(c.added)} the public has not been told of`;
  if (c.gone > 0 && c.added > 0) return `${gone[0].toUpperCase()}${gone.slice(1)}, which has ${added}; ${first}.`;
  if (c.gone > 0) return `${gone[0].toUpperCase()}${gone.slice(1)}; ${first}.`;
  return `The newest forecast has ${added} from today on; ${first}.`;
}
