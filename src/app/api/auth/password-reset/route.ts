import { NextResponse } from "next/server";
import { AppError, handler, readJson } from "@/lib/server/errors";
import { clientAddress } from "@/lib/server/signin";
import { passwordResetRequestSchema } from "@/lib/server/mail/schemas";
import { newShareToken } from "@/lib/server/share-token";
import { enqueueMail } from "@/lib/server/mail/outbox";
import { passwordResetMail } from "@/lib/server/mail/templates";
import { appBaseUrl } from "@/lib/server/mail/links";
import { insertPasswordReset } from "@db/queries/invitations";
import { inTransaction } from "@db/queries/mail";
import { MAX_RESETS_PER_ACCOUNT, MAX_RESETS_PER_ADDRESS, RESET_LINK_MS, RESET_REQUESTED, RESET_TOO_MANY, RESET_WINDOW_MS } from "@/lib/server/mail/reset";
import { getUserByEmail, reserveAttempt } from "@db/queries/users";
import type { PasswordResetRequestedAnswer } from "@/lib/account-contract";

/**
 * Always the same 200 answer whether or not the account exists; an e-mail is queued only for a real account.
 * Requests are counted per e-mail and per client address (in sign_in_attempts, under "reset:" keys).
 */
export const POST = handler(async (req: Request) => {
  const { email } = await readJson(req, passwordResetRequestSchema);
  const accountKey = `reset:account:${email.trim().toLowerCase()}`;
  const addressKey = `reset:address:${clientAddress(req.headers)}`;
  // Each request reserves its place before anything else happens, so parallel requests cannot exceed the limits.
  if ((await reserveAttempt({ key: addressKey, windowMs: RESET_WINDOW_MS, max: MAX_RESETS_PER_ADDRESS })) === null) throw new AppError("too_many", RESET_TOO_MANY);
  if ((await reserveAttempt({ key: accountKey, windowMs: RESET_WINDOW_MS, max: MAX_RESETS_PER_ACCOUNT })) === null) throw new AppError("too_many", RESET_TOO_MANY);
  const user = await getUserByEmail({ email });
  if (user) {
    const { token, tokenHash } = newShareToken();
    const link = `${appBaseUrl(req)}/reset/${token}`;
    await inTransaction(async (tx) => {
      await insertPasswordReset({ tx, userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_LINK_MS) });
      await enqueueMail(tx, passwordResetMail({ to: user.email, name: user.name, link }));
    });
  }
  return NextResponse.json({ ok: true, message: RESET_REQUESTED } satisfies PasswordResetRequestedAnswer);
});
