/**
 * Field progress entries for forms and handlers, in one module: the entry contract (zod, `sim/progress-entry.ts`,
 * also the data layer's and the demo seed's type), the rules that need the plan and the other entries
 * (`checkProgressEntry`, `checkDependents`, `sim/progress-rules.ts`), the condition labels and the re-forecast
 * request.
 */
import { localDate } from "./local-clock";
import { z } from "zod";
export { checkDependents, checkProgressEntry, crewPredecessors, parseStation, sta, type RuleEntry } from "@sim/progress-rules";
import { plainText, realIsoDate } from "@sim/text";

export { DISCOVERED_KINDS, discoveredItemSchema, progressEntrySchema, progressUpdateSchema, type DiscoveredInput, type ProgressEntry, type ProgressEntryInput } from "@sim/progress-entry";
import { DISCOVERED_KINDS } from "@sim/progress-entry";

export const DISCOVERED_LABELS: Record<(typeof DISCOVERED_KINDS)[number], string> = {
  "bottom-mat": "Bottom-mat exposure",
  "full-depth": "Full-depth repair",
};

export const reforecastSchema = z.object({
  dataDate: realIsoDate("Data date"),
  seed: plainText(60, { label: "Seed" }).trim().min(1, "Seed must not be empty"),
  iterations: z.number().int("Iterations must be a whole number").min(10, "Iterations must be at least 10").max(5_000, "Iterations must be at most 5,000 (the server computes re-forecasts)"),
});

/** Today's date in a time zone, `YYYY-MM-DD` (UTC when the zone is unknown). */
export function todayIn(timeZone: string, now: Date = new Date()): string {
  return localDate(now, timeZone);
}
