import "server-only";
import { clearFailedSignIns, getUserByEmail, releaseAttempt, reserveAttempt } from "@db/queries/users";
import { verifyPassword } from "./password";

export { clientAddress } from "@/lib/http/trusted-proxy";

const WINDOW_MS = 15 * 60 * 1000;
export const MAX_ACCOUNT_FAILURES = 5;
export const MAX_ADDRESS_FAILURES = 30;

export const SIGN_IN_FAILED = "That e-mail and password do not match an account.";
export const SIGN_IN_LOCKED = "Too many failed sign-ins. Wait 15 minutes and try again.";

export type SignInResult = { ok: true; userId: string } | { ok: false; status: 401 | 429; message: string };

/**
 * Unknown account and wrong password give the same message and take the same time. Every attempt first
 * reserves a slot per account and per client address (each counted atomically in the database); only an
 * attempt that got both has its password checked, so in one window no more than MAX_ACCOUNT_FAILURES
 * passwords are ever tried against an account, however many requests arrive at once — and the account's
 * count in sign_in_attempts is exactly the number tried. A success gives its slots back (the account's count
 * starts again); a failure keeps them.
 */
export async function attemptSignIn({ email, password, address }: { email: string; password: string; address: string }): Promise<SignInResult> {
  const accountKey = `account:${email.trim().toLowerCase()}`;
  const addressKey = `address:${address}`;
  if ((await reserveAttempt({ key: accountKey, windowMs: WINDOW_MS, max: MAX_ACCOUNT_FAILURES })) === null) return locked();
  if ((await reserveAttempt({ key: addressKey, windowMs: WINDOW_MS, max: MAX_ADDRESS_FAILURES })) === null) {
    // No password was checked, so the account's slot goes back: its count stays the number of passwords tried.
    await releaseAttempt({ key: accountKey });
    return locked();
  }
  const user = await getUserByEmail({ email });
  const ok = await verifyPassword(user?.passwordHash ?? null, password);
  if (!ok || !user) return { ok: false, status: 401, message: SIGN_IN_FAILED };
  await Promise.all([clearFailedSignIns({ key: accountKey }), releaseAttempt({ key: addressKey })]);
  return { ok: true, userId: user.id };
}

function locked(): SignInResult {
  return { ok: false, status: 429, message: SIGN_IN_LOCKED };
}

export const OWN_PASSWORD_WRONG = "is not your current password";
export const OWN_PASSWORD_LOCKED = "Too many wrong passwords. Wait 15 minutes and try again.";

/**
 * The signed-in person's current password, checked before it is changed. It counts against the same per-account
 * limit as signing in (MAX_ACCOUNT_FAILURES in the window), so a session left open on a shared computer cannot be
 * used to guess the password either; a right one gives its slot back.
 */
export async function checkOwnPassword({ email, password }: { email: string; password: string }): Promise<"ok" | "wrong" | "locked"> {
  const accountKey = `account:${email.trim().toLowerCase()}`;
  if ((await reserveAttempt({ key: accountKey, windowMs: WINDOW_MS, max: MAX_ACCOUNT_FAILURES })) === null) return "locked";
  const user = await getUserByEmail({ email });
  if (!(await verifyPassword(user?.passwordHash ?? null, password))) return "wrong";
  await releaseAttempt({ key: accountKey });
  return "ok";
}
