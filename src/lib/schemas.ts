/** Request schemas shared by forms, route handlers and server actions. */
import { z } from "zod";
import { ROLES } from "@db/schema-enums";
import { LIMITS } from "@sim/limits";
import { runSummarySchema } from "@sim/run-summary-schema";
import { controlCharacterIn, plainText } from "@sim/text";
import { stationField } from "@sim/progress-entry";

/** A one-line text of at most `max` characters (no control characters), trimmed. */
const line = (max: number) => plainText(max).trim();

export const signInSchema = z.object({
  email: z.email("must be an e-mail address").max(200),
  password: z.string().min(1, "must not be empty").max(200),
});

/** Every new password: a reset, an invitation's new account, a change on the account page. */
export const MIN_PASSWORD_LENGTH = 10;
export const newPasswordField = z
  .string({ error: "must be text" })
  .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(200, "must be at most 200 characters");

/** The signed-in person's own name and title (what others see beside their changes and in the header). */
export const accountDetailsSchema = z
  .object({
    name: line(120).min(1, "must not be empty"),
    title: line(120).default(""),
  })
  .strict();

/** Changing one's password: the current one proves it is the account's owner at the keyboard. */
export const passwordChangeSchema = z
  .object({
    currentPassword: z.string({ error: "must be text" }).min(1, "must not be empty").max(200, "must be at most 200 characters"),
    newPassword: newPasswordField,
    confirm: z.string({ error: "must be text" }).max(200, "must be at most 200 characters"),
  })
  .strict()
  .refine((v) => v.newPassword === v.confirm, { path: ["confirm"], message: "must match the new password" })
  .refine((v) => v.newPassword !== v.currentPassword, { path: ["newPassword"], message: "must differ from the current password" });

export const scenarioWriteSchema = z.object({
  name: line(LIMITS.name).min(1, "must not be empty"),
  description: plainText(LIMITS.description, { multiline: true }).default(""),
  /** Checked in full by the scenario format (`validateDefinition`); what is stored is its parse output. */
  definition: z.record(z.string(), z.unknown()),
  changeNote: line(300).default(""),
});

export const scenarioUpdateSchema = scenarioWriteSchema.extend({
  version: z.number().int().min(1, "must be the version you loaded"),
});

export const variantSchema = z.object({ name: line(LIMITS.name).min(1, "must not be empty") });

/** A deck station: feet, or typed as feet or station notation ("1250", "12+50", "STA 12+50"), on or after STA 0+00. */
const stationFt = stationField().pipe(z.number().min(0, "must not be below STA 0+00").max(1_000_000, "must be at most STA 10000+00"));

/** Lane names as a list, or typed as one line separated by commas ("L1, L2, L3"). */
const laneNames = z
  .union(
    [
      z.array(z.string().max(LIMITS.laneName * 4, `must be names of at most ${LIMITS.laneName} characters`)).max(LIMITS.lanes * 4, `must name at most ${LIMITS.lanes} lanes`),
      z.string().max(LIMITS.laneName * LIMITS.lanes * 2, `must name at most ${LIMITS.lanes} lanes of at most ${LIMITS.laneName} characters`),
    ],
    { error: "must be lane names separated by commas (L1, L2)" },
  )
  .transform((v) => (typeof v === "string" ? v.split(",") : v).map((s) => s.trim()).filter((s) => s.length > 0))
  // Judged as a whole so each problem lands on "lanes" itself, naming the lane: a form shows it beside its one input.
  .pipe(
    z
      .array(z.string())
      .min(1, "must name at least one lane")
      .max(LIMITS.lanes, `must name at most ${LIMITS.lanes} lanes`)
      .superRefine((lanes, ctx) => {
        const seen = new Set<string>();
        for (const lane of lanes) {
          const shown = lane.length > 24 ? `${lane.slice(0, 24)}…` : lane;
          if (lane.length > LIMITS.laneName) ctx.addIssue({ code: "custom", message: `must be names of at most ${LIMITS.laneName} characters (“${shown}” has ${lane.length})` });
          else if (controlCharacterIn(lane)) ctx.addIssue({ code: "custom", message: `must not contain control characters (in “${shown}”)` });
          else if (seen.has(lane)) ctx.addIssue({ code: "custom", message: `must not name a lane twice (“${shown}”)` });
          seen.add(lane);
        }
      }),
  );

/**
 * A project's details: the structure and its deck as scenarios on it start from (the standard template takes the
 * deck length, start station and lane names). Starting a project sends them (its creator becomes its
 * administrator); editing sends them whole again. Shared by the form and both routes.
 */
export const projectDetailsSchema = z
  .object({
    name: line(LIMITS.name).min(1, "must not be empty"),
    structureName: line(LIMITS.name).min(1, "must not be empty"),
    region: line(LIMITS.name).default(""),
    // The scenario format's bound: a scenario made from the project must be valid.
    deckLengthFt: z
      .number({ error: "must be a number of feet" })
      .gt(0, "must be more than 0 ft")
      .max(LIMITS.deckLengthFt, `must be at most ${LIMITS.deckLengthFt.toLocaleString("en-US")} ft`),
    startStationFt: stationFt,
    lanes: laneNames,
    description: plainText(LIMITS.description, { multiline: true }).default(""),
  })
  .strict();

/** Archive a project (true) or restore it (false): its administrators, on the project page. */
export const projectArchiveSchema = z.object({ archived: z.boolean({ error: "must be true (archive) or false (restore)" }) }).strict();

/** The project's plan of record: one of its scenarios, or null for none. */
export const planOfRecordSchema = z.object({ planScenarioId: z.uuid("must name one of the project's scenarios").nullable() }).strict();

/** A member's own choice: an e-mail with each new forecast of the project's plan of record, or not. */
export const forecastAlertsSchema = z.object({ forecastAlerts: z.boolean({ error: "must be true (send them) or false (stop them)" }) }).strict();

/** A local whole hour 0–23 after which something runs each day or week, or null (off). */
const hourOrOff = () =>
  z
    .number({ error: "must be a whole hour from 0 to 23, or empty to turn it off" })
    .int("must be a whole hour from 0 to 23")
    .min(0, "must be a whole hour from 0 to 23")
    .max(23, "must be a whole hour from 0 to 23")
    .nullable();

/**
 * The weekly closure e-mail to the project's closure-notice subscribers: the local weekday (0 = Sunday … 6 =
 * Saturday) and hour after which it goes out, or both null (off).
 */
export const closureWeeklySchema = z
  .object({
    closureWeeklyDay: z
      .number({ error: "must be a day of the week from 0 (Sunday) to 6 (Saturday), or empty to turn it off" })
      .int("must be a day of the week from 0 (Sunday) to 6 (Saturday)")
      .min(0, "must be a day of the week from 0 (Sunday) to 6 (Saturday)")
      .max(6, "must be a day of the week from 0 (Sunday) to 6 (Saturday)")
      .nullable(),
    closureWeeklyHour: hourOrOff(),
  })
  .strict()
  .refine((v) => (v.closureWeeklyDay === null) === (v.closureWeeklyHour === null), {
    path: ["closureWeeklyHour"],
    message: "must be set when a day is, and empty when the day is (both empty turn the e-mail off)",
  });

/** The daily re-forecast of the plan of record: the local hour after which it runs each day, or null (off). */
export const dailyReforecastSchema = z
  .object({
    dailyReforecastHour: hourOrOff(),
  })
  .strict();

export const memberSchema = z.object({ email: z.email("must be an e-mail address").max(200), role: z.enum(ROLES) });
/** An invitation names a person and a role like adding a member does; the same contract. */
export const invitationSchema = memberSchema;

export const shareLinkSchema = z.object({
  label: line(120).default(""),
  expiresInDays: z.number().int().min(1, "must be at least 1 day").max(365, "must be at most 365 days"),
  /** Addresses to e-mail the new link to, in the same transaction as the link itself. */
  emailTo: z.array(z.email("must be an e-mail address").max(200)).max(10, "may list at most 10 addresses").default([]),
});

export const MAX_BROWSER_ITERATIONS = 50_000;
/** A run the server's engine workers compute (a run without a summary); the work budget applies as well. */
export const MAX_SERVER_ITERATIONS = 5_000;

/** Run bodies carry the representative trace (about 100 bytes per packet and operation). */
export const MAX_RUN_BODY_BYTES = 8 * 1024 * 1024;

/** A run to store. Strict: a field the contract does not know is refused, not stored. */
export const runWriteSchema = z.object({
  seed: line(60).min(1, "must not be empty"),
  iterations: z.number().int("must be a whole number").min(10, "must be at least 10").max(MAX_BROWSER_ITERATIONS, `must be at most ${MAX_BROWSER_ITERATIONS}`),
  /** The version the run was computed from; a run of an older version is refused rather than mislabelled. */
  scenarioVersion: z.number().int().min(1).optional(),
  /** A summary computed in the browser's worker pool (the run-result contract): stored as pending, then verified by a server job. */
  summary: runSummarySchema.optional(),
  durationMs: z.number().int().min(0).max(86_400_000).optional(),
}).strict();

export const closureSubscriberSchema = z.object({
  email: z.email("must be an e-mail address").max(200),
  label: line(120).default(""),
});

/** Publishing closures: the run the user previewed (optional for scripts; when given, a newer run is refused). */
export const closurePublicationSchema = z.object({
  runId: z.uuid("must be the id of the previewed run").optional(),
});
