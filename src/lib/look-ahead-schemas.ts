/** Request contracts of the look-ahead: the project's location and the daily notice. Shared by forms and handlers. */
import { z } from "zod";

const degrees = (name: string, limit: number) =>
  z
    .number({ error: `${name} must be a number of degrees.` })
    .min(-limit, `${name} must be between −${limit} and ${limit} degrees.`)
    .max(limit, `${name} must be between −${limit} and ${limit} degrees.`)
    .nullable();

/** Both set, or both null (no location). */
export const projectLocationSchema = z
  .object({ latitude: degrees("Latitude", 90), longitude: degrees("Longitude", 180) })
  .refine((l) => (l.latitude === null) === (l.longitude === null), { path: ["longitude"], message: "Give both latitude and longitude, or clear both." });
export type ProjectLocation = z.infer<typeof projectLocationSchema>;

export const MAX_NOTICE_RECIPIENTS = 20;

export const lookAheadNoticeSchema = z.object({
  enabled: z.boolean(),
  hour: z.number({ error: "The hour must be a whole hour from 0 to 23." }).int("The hour must be a whole hour from 0 to 23.").min(0, "The hour must be a whole hour from 0 to 23.").max(23, "The hour must be a whole hour from 0 to 23."),
  recipients: z
    .array(z.email("Each recipient must be an e-mail address.").max(254))
    .min(1, "Name at least one recipient.")
    .max(MAX_NOTICE_RECIPIENTS, `At most ${MAX_NOTICE_RECIPIENTS} recipients.`),
});
export type LookAheadNoticeInput = z.infer<typeof lookAheadNoticeSchema>;
