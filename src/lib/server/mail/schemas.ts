import "server-only";
/** Request schemas of the e-mail flows (invitations, password reset). */
import { z } from "zod";

import { newPasswordField as newPassword } from "@/lib/schemas";

export { invitationSchema, MIN_PASSWORD_LENGTH } from "@/lib/schemas";

export const passwordResetRequestSchema = z.object({ email: z.email("must be an e-mail address").max(200) });


export const passwordResetConfirmSchema = z.object({ token: z.string().min(1).max(200), password: newPassword });

export const acceptNewAccountSchema = z
  .object({
    name: z.string().trim().min(1, "must not be empty").max(120),
    password: newPassword,
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "must match the password" });
