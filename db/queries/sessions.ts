import "server-only";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { eq, sql } from "drizzle-orm";
import type { DatabaseSession, DatabaseUser } from "lucia";
import { getDb, prepared } from "../client";
import { sessions, users } from "../schema";

/**
 * The session store behind lucia (src/lib/server/auth.ts): the drizzle adapter, except for the lookup every
 * signed-in request makes, which is a prepared query (one round trip instead of two, see `prepared`) and
 * reads only the person's columns the app uses — never the password hash.
 */
class SessionStore extends DrizzlePostgreSQLAdapter {
  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const [row] = await prepared("session_and_user", lookup).execute({ sessionId });
    if (!row) return [null, null];
    const { session, user } = row;
    return [
      { id: session.id, userId: session.userId, expiresAt: session.expiresAt, attributes: { createdAt: session.createdAt } },
      { id: user.id, attributes: { email: user.email, name: user.name, title: user.title } },
    ];
  }
}

const lookup = (db: ReturnType<typeof getDb>) =>
  db
    .select({
      session: { id: sessions.id, userId: sessions.userId, expiresAt: sessions.expiresAt, createdAt: sessions.createdAt },
      user: { id: users.id, email: users.email, name: users.name, title: users.title },
    })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(eq(sessions.id, sql.placeholder("sessionId")))
    .prepare("session_and_user");

export function sessionStore() {
  return new SessionStore(getDb(), sessions, users);
}
