import "server-only";
import { Lucia, TimeSpan, type Cookie, type Session, type User } from "lucia";
import { createHash } from "node:crypto";
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
export function sessionCookie(token: string, session: Session): Cookie {
  const c = lucia().createSessionCookie(token);
  const until = Math.min(session.expiresAt.getTime(), session.createdAt.getTime() + SESSION_ABSOLUTE_MS);
  c.attributes.maxAge = Math.max(0, Math.floor((until - Date.now()) / 1000));
  return c;
}

/**
 * What a session token stands for now, and the cookie to send back: the same token with a later expiry when the
 * session was just extended, a blank one when the token is unknown, expired or past the absolute limit (which
 * also ends the session). Free of the framework, so the read routes served beside Next
 * (src/lib/server/fast-reads.ts) decide sessions exactly as every other route does.
 */
export async function checkSessionToken(token: string): Promise<{ signedIn: SignedIn | null; cookie: Cookie | null }> {
  let result = await lucia().validateSession(sessionKey(token));
  if (result.session && Date.now() - result.session.createdAt.getTime() >= SESSION_ABSOLUTE_MS) {
    await lucia().invalidateSession(result.session.id);
    result = { session: null, user: null };
  }
  if (!result.session || !result.user) return { signedIn: null, cookie: lucia().createBlankSessionCookie() };
  return { signedIn: { user: result.user, session: result.session }, cookie: result.session.fresh ? sessionCookie(token, result.session) : null };
}
