import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { lucia, startSession } from "@/lib/server/auth";
import { hashPassword } from "@/lib/server/password";
import { hashShareToken } from "@/lib/server/share-token";
import { passwordResetConfirmSchema } from "@/lib/server/mail/schemas";
import { consumePasswordReset } from "@db/queries/invitations";
import { RESET_LINK_PROBLEM } from "@/lib/server/mail/reset";
import { clearFailedSignIns } from "@db/queries/users";

/**
 * Sets the new password, ends every session of the account (a stolen session must not outlive the reset),
 * lifts a sign-in lockout and signs this browser in with a fresh session.
 */
export const POST = handler(async (req: Request) => {
  const body = await readJson(req, passwordResetConfirmSchema);
  const result = await consumePasswordReset({ tokenHash: hashShareToken(body.token), passwordHash: await hashPassword(body.password) });
  if (!result.ok) throw new AppError("not_found", RESET_LINK_PROBLEM[result.reason]);
  await lucia().invalidateUserSessions(result.userId);
  await clearFailedSignIns({ key: `account:${result.email}` });
  await startSession(result.userId);
  return NextResponse.json({ ok: true });
});
