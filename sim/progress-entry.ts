/**
 * One field-log entry (a shift of one operation): the zod contract shared by the shift form, the route
 * handlers, the data layer's stored fields and history, and the demo seed's field log. Structural checks
 * only; the rules that need the plan and the other entries are in ./progress-rules. Pure.
 */
import { z } from "zod";
import { parseStation } from "./progress-rules";
import { plainText, realIsoDate } from "./text";

export const DISCOVERED_KINDS = ["bottom-mat", "full-depth"] as const;

const isoDate = realIsoDate("Work date");
// zod 4 numbers refuse NaN and ±Infinity, so an empty number input (NaN) gets this message.
const num = (label: string) => z.number({ error: `${label} must be a number` });
/**
 * A station as a number of feet, or typed as feet or 12+50; anything else ("12a0") is refused, never trimmed.
 * `label` starts the messages ("From station must be …") for forms that show them without a path. Every
 * station a person types goes through this one field (the field log here, a project's start station).
 */
export const stationField = (label?: string) => {
  const lead = label ? `${label} ` : "";
  return z.union([z.number(), z.string()], { error: `${lead}must be in feet (1250) or a station (12+50)` }).transform((v, ctx) => {
    const n = typeof v === "number" ? v : parseStation(v);
    if (n === null || !Number.isFinite(n)) {
      ctx.addIssue({ code: "custom", message: `${lead}must be in feet (1250) or a station (12+50)${typeof v === "string" && v.trim() ? `; “${v.trim()}” is neither` : ""}` });
      return z.NEVER;
    }
    return n;
  });
};

export const discoveredItemSchema = z
  .object({
    kind: z.enum(DISCOVERED_KINDS, { error: "Condition must be bottom-mat exposure or full-depth repair" }),
    fromStationFt: stationField("Condition from station"),
    toStationFt: stationField("Condition to station"),
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
    fromStationFt: stationField("From station"),
    toStationFt: stationField("To station"),
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
