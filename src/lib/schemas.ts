/** Request schemas shared by forms, route handlers and server actions. */
import { z } from "zod";
import { ROLES } from "@db/schema-enums";

export const signInSchema = z.object({
  email: z.email("must be an e-mail address").max(200),
  password: z.string().min(1, "must not be empty").max(200),
});

export const scenarioWriteSchema = z.object({
  name: z.string().trim().min(1, "must not be empty").max(120),
  description: z.string().max(2000).default(""),
  definition: z.record(z.string(), z.unknown()),
  changeNote: z.string().max(300).default(""),
});

export const scenarioUpdateSchema = scenarioWriteSchema.extend({
  version: z.number().int().min(1, "must be the version you loaded"),
});

export const variantSchema = z.object({ name: z.string().trim().min(1, "must not be empty").max(120) });

export const memberSchema = z.object({ email: z.email("must be an e-mail address"), role: z.enum(ROLES) });

export const shareLinkSchema = z.object({
  label: z.string().max(120).default(""),
  expiresInDays: z.number().int().min(1, "must be at least 1 day").max(365, "must be at most 365 days"),
});
