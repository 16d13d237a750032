import "server-only";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, type Session, type User } from "lucia";
import { cookies } from "next/headers";
import { cache } from "react";
import { getDb } from "@db/client";
import { sessions, users } from "@db/schema";

let instance: Lucia<Record<never, never>, { email: string; name: string; title: string }> | null = null;

/** Created on first use: the adapter needs the database, which the build does not have. */
export function lucia() {
  if (!instance) {
    instance = new Lucia(new DrizzlePostgreSQLAdapter(getDb(), sessions, users), {
      sessionCookie: {
        name: "pourline_session",
        expires: false,
        attributes: { secure: process.env.NODE_ENV === "production", sameSite: "lax" },
      },
      getUserAttributes: (a) => ({ email: a.email, name: a.name, title: a.title }),
    });
  }
  return instance;
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof lucia>;
    DatabaseUserAttributes: { email: string; name: string; title: string };
  }
}

export type SignedIn = { user: User; session: Session };

/** The signed-in user of this request, or null. Refreshes the cookie when lucia extends the session. */
export const currentSession = cache(async (): Promise<SignedIn | null> => {
  const jar = await cookies();
  const id = jar.get(lucia().sessionCookieName)?.value ?? null;
  if (!id) return null;
  const result = await lucia().validateSession(id);
  try {
    if (result.session?.fresh) {
      const c = lucia().createSessionCookie(result.session.id);
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
  const session = await lucia().createSession(userId, {});
  const c = lucia().createSessionCookie(session.id);
  (await cookies()).set(c.name, c.value, c.attributes);
}

export async function endSession() {
  const s = await currentSession();
  if (s) await lucia().invalidateSession(s.session.id);
  const c = lucia().createBlankSessionCookie();
  (await cookies()).set(c.name, c.value, c.attributes);
}
