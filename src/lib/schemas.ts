/** Request schemas shared by forms, route handlers and server actions. */
import { z } from "zod";
import { ROLES } from "@db/schema-enums";
import { LIMITS } from "@sim/limits";
import { runSummarySchema } from "@sim/run-summary-schema";
import { plainText } from "@sim/text";

/** A one-line text of at most `max` characters (no control characters), trimmed. */
const line = (max: number) => plainText(max).trim();

export const signInSchema = z.object({
  email: z.email("must be an e-mail address").max(200),
  password: z.string().min(1, "must not be empty").max(200),
});

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
