/**
 * Field progress entries: the zod schema shared by the shift form and the route handlers. The rules that need
 * the plan and the other entries (`checkProgressEntry`, `checkDependents`) live with the as-built rules in
 * `sim/progress-rules.ts` and are re-exported here, so forms and handlers import one module.
 */
import { z } from "zod";
import { parseStation } from "@sim/progress-rules";
export { checkDependents, checkProgressEntry, crewPredecessors, parseStation, sta, type RuleEntry } from "@sim/progress-rules";
import { plainText, realIsoDate } from "@sim/text";

export const DISCOVERED_KINDS = ["bottom-mat", "full-depth"] as const;
export const DISCOVERED_LABELS: Record<(typeof DISCOVERED_KINDS)[number], string> = {
  "bottom-mat": "Bottom-mat exposure",
  "full-depth": "Full-depth repair",
};

const isoDate = realIsoDate("Work date");
// zod 4 numbers refuse NaN and ±Infinity, so an empty number input (NaN) gets this message.
const num = (label: string) => z.number({ error: `${label} must be a number` });
/** A station as a number of feet, or typed as feet or 12+50; anything else ("12a0") is refused, never trimmed. */
const station = (label: string) =>
  z.union([z.number({ error: `${label} must be in feet (1250) or a station (12+50)` }), z.string()]).transform((v, ctx) => {
    const n = typeof v === "number" ? v : parseStation(v);
    if (n === null || !Number.isFinite(n)) {
      ctx.addIssue({ code: "custom", message: `${label} must be in feet (1250) or a station (12+50)${typeof v === "string" && v.trim() ? `; “${v.trim()}” is neither` : ""}` });
      return z.NEVER;
    }
    return n;
  });

export const discoveredItemSchema = z
  .object({
    kind: z.enum(DISCOVERED_KINDS, { error: "Condition must be bottom-mat exposure or full-depth repair" }),
    fromStationFt: station("Condition from station"),
    toStationFt: station("Condition to station"),
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
    fromStationFt: station("From station"),
    toStationFt: station("To station"),
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
