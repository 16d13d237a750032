import "server-only";
import { cookies } from "next/headers";
import { cache } from "react";
import { randomBytes } from "node:crypto";
import { checkSessionToken, lucia, sessionCookie, sessionKey, type SignedIn } from "./session-token";

export { lucia, sessionKey, SESSION_ABSOLUTE_MS, SESSION_IDLE, type SignedIn } from "./session-token";

/** The signed-in user of this request, or null. Refreshes the cookie when the session was extended. */
export const currentSession = cache(async (): Promise<SignedIn | null> => {
  const jar = await cookies();
  const token = jar.get(lucia().sessionCookieName)?.value ?? null;
  if (!token) return null;
  const { signedIn, cookie } = await checkSessionToken(token);
  try {
    if (cookie) jar.set(cookie.name, cookie.value, cookie.attributes);
  } catch {
    // Server components may not set cookies; the next route handler or action will.
  }
  return signedIn;
});

export async function startSession(userId: string) {
  const token = randomBytes(32).toString("base64url");
  const session = await lucia().createSession(userId, { createdAt: new Date() }, { sessionId: sessionKey(token) });
  const c = sessionCookie(token, session);
  (await cookies()).set(c.name, c.value, c.attributes);
}

export async function endSession() {
  const s = await currentSession();
  if (s) await lucia().invalidateSession(s.session.id);
  const c = lucia().createBlankSessionCookie();
  (await cookies()).set(c.name, c.value, c.attributes);
}
