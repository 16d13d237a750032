/**
 * What the signed-in person's account routes answer, and the request for a way back in:
 * - `PUT /api/account` → `AccountDetailsAnswer`: the name and title as stored, the request's contract once parsed;
 * - `DELETE /api/account/sessions` → `SessionsEndedAnswer`: how many other browsers were signed out (this one gets a
 *   new session, so it is not counted);
 * - `POST /api/auth/password-reset` → `PasswordResetRequestedAnswer`: the same words whether or not the account
 *   exists, so the answer does not tell who has one.
 */
import type { z } from "zod";
import type { accountDetailsSchema } from "./schemas";

export type AccountDetailsAnswer = z.output<typeof accountDetailsSchema>;

export interface SessionsEndedAnswer {
  endedElsewhere: number;
}

export interface PasswordResetRequestedAnswer {
  ok: true;
  message: string;
}
