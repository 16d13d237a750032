import "server-only";
import { Lucia, TimeSpan, type Cookie, type Session, type User } from "lucia";
import { cookies } from "next/headers";
import { cache } from "react";
import { createHash, randomBytes } from "node:crypto";
import { sessionStore } from "@db/queries/sessions";

/**
 * Sessions: the cookie carries a 256-bit random token; the database keeps only its SHA-256 as the session id,
 * so a leaked sessions table (or a log line holding a key) cannot be replayed as a cookie. A session lives
 * SESSION_IDLE without use and is renewed (sliding) while in use — lucia extends it once half the idle time
 * has passed — but never beyond SESSION_ABSOLUTE after sign-in. The cookie's Max-Age follows the session.
 */
export const SESSION_IDLE = new TimeSpan(12, "h");
export const SESSION_ABSOLUTE_MS = 7 * 24 * 60 * 60 * 1000;

let instance: Lucia<{ createdAt: Date }, { email: string; name: string; title: string }> | null = null;

/** Created on first use: the adapter needs the database, which the build does not have. */
export function lucia() {
  if (!instance) {
    instance = new Lucia(sessionStore(), {
      sessionExpiresIn: SESSION_IDLE,
      sessionCookie: {
        name: "pourline_session",
        expires: true,
        attributes: { secure: process.env.NODE_ENV === "production", sameSite: "lax" },
      },
      getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
      getUserAttributes: (a) => ({ email: a.email, name: a.name, title: a.title }),
    });
  }
  return instance;
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof lucia>;
    DatabaseSessionAttributes: { createdAt: Date };
    DatabaseUserAttributes: { email: string; name: string; title: string };
  }
}

/** The database key of a session token. */
export function sessionKey(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export type SignedIn = { user: User; session: Session };

/** The cookie for `token`, expiring with the session: at its idle limit or its absolute limit, whichever is first. */
function sessionCookie(token: string, session: Session): Cookie {
  const c = lucia().createSessionCookie(token);
  const until = Math.min(session.expiresAt.getTime(), session.createdAt.getTime() + SESSION_ABSOLUTE_MS);
  c.attributes.maxAge = Math.max(0, Math.floor((until - Date.now()) / 1000));
  return c;
}

/** The signed-in user of this request, or null. Refreshes the cookie when the session was extended. */
export const currentSession = cache(async (): Promise<SignedIn | null> => {
  const jar = await cookies();
  const token = jar.get(lucia().sessionCookieName)?.value ?? null;
  if (!token) return null;
  let result = await lucia().validateSession(sessionKey(token));
  if (result.session && Date.now() - result.session.createdAt.getTime() >= SESSION_ABSOLUTE_MS) {
    await lucia().invalidateSession(result.session.id);
    result = { session: null, user: null };
  }
  try {
    if (result.session?.fresh) {
      const c = sessionCookie(token, result.session);
      jar.set(c.name, c.value, c.attributes);
    }
    if (!result.session) {
      const c = lucia().createBlankSessionCookie();
      jar.set(c.name, c.value, c.attributes);
    }
  } catch {
    // Server components may not set cookies; the next route handler or action will.
  }
  return result.session && result.user ? { user: result.user, session: result.session } : null;
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
