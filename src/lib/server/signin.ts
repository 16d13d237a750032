import "server-only";
import { clearFailedSignIns, getFailedSignIns, getUserByEmail, recordFailedSignIn } from "@db/queries/users";
import { verifyPassword } from "./password";

const WINDOW_MS = 15 * 60 * 1000;
export const MAX_ACCOUNT_FAILURES = 5;
export const MAX_ADDRESS_FAILURES = 30;

export const SIGN_IN_FAILED = "That e-mail and password do not match an account.";
export const SIGN_IN_LOCKED = "Too many failed sign-ins. Wait 15 minutes and try again.";

export type SignInResult = { ok: true; userId: string } | { ok: false; status: 401 | 429; message: string };

/**
 * Unknown account and wrong password give the same message and take the same time. Failures count per
 * account and per address; past either limit, sign-in is refused for the rest of the window even with the
 * right password.
 */
export async function attemptSignIn({ email, password, address }: { email: string; password: string; address: string }): Promise<SignInResult> {
  const accountKey = `account:${email.trim().toLowerCase()}`;
  const addressKey = `address:${address}`;
  const [accountFails, addressFails] = await Promise.all([
    getFailedSignIns({ key: accountKey, windowMs: WINDOW_MS }),
    getFailedSignIns({ key: addressKey, windowMs: WINDOW_MS }),
  ]);
  if (accountFails >= MAX_ACCOUNT_FAILURES || addressFails >= MAX_ADDRESS_FAILURES) {
    return { ok: false, status: 429, message: SIGN_IN_LOCKED };
  }
  const user = await getUserByEmail({ email });
  const ok = await verifyPassword(user?.passwordHash ?? null, password);
  if (!ok || !user) {
    await Promise.all([recordFailedSignIn({ key: accountKey, windowMs: WINDOW_MS }), recordFailedSignIn({ key: addressKey, windowMs: WINDOW_MS })]);
    return { ok: false, status: 401, message: SIGN_IN_FAILED };
  }
  await clearFailedSignIns({ key: accountKey });
  return { ok: true, userId: user.id };
}

export function clientAddress(headers: Headers): string {
  return headers.get("x-forwarded-for")?.split(",")[0]?.trim() || headers.get("x-real-ip") || "local";
}
