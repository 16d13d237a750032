import "server-only";
import { and, count, eq, gt, sql } from "drizzle-orm";
import { getDb } from "../client";
import { sessions, signInAttempts, users } from "../schema";

export async function getUserByEmail({ email }: { email: string }) {
  const [row] = await getDb().select().from(users).where(eq(users.email, email.trim().toLowerCase()));
  return row ?? null;
}

export async function getUserById({ id }: { id: string }) {
  const [row] = await getDb().select().from(users).where(eq(users.id, id));
  return row ?? null;
}

export async function createUser(u: { id: string; email: string; name: string; title?: string; passwordHash: string | null }) {
  await getDb()
    .insert(users)
    .values({ ...u, email: u.email.trim().toLowerCase(), title: u.title ?? "" });
}

/** The person's own name and title. */
export async function updateUserDetails({ id, name, title }: { id: string; name: string; title: string }) {
  await getDb().update(users).set({ name, title }).where(eq(users.id, id));
}

/**
 * A new password and the end of every session of the account, in one transaction: a session someone else holds
 * must not outlive the change, and a password changed without ending them would leave it standing.
 */
export async function changePasswordEndingSessions({ id, passwordHash }: { id: string; passwordHash: string }) {
  await getDb().transaction(async (tx) => {
    await tx.update(users).set({ passwordHash }).where(eq(users.id, id));
    await tx.delete(sessions).where(eq(sessions.userId, id));
  });
}

/** Ends every session of the account (the caller starts a new one for the browser that asked). */
export async function endAllSessions({ id }: { id: string }): Promise<number> {
  const ended = await getDb().delete(sessions).where(eq(sessions.userId, id)).returning({ id: sessions.id });
  return ended.length;
}

/** Sessions of the account that have not expired (idle, or signed in before `signedInAfter`), this one included. */
export async function countLiveSessions({ id, signedInAfter }: { id: string; signedInAfter: Date }): Promise<number> {
  const [row] = await getDb()
    .select({ n: count() })
    .from(sessions)
    .where(and(eq(sessions.userId, id), gt(sessions.expiresAt, new Date()), gt(sessions.createdAt, signedInAfter)));
  return row?.n ?? 0;
}

/**
 * Reserves one attempt for `key` before the attempt is made: in one statement, counts it if fewer than `max`
 * were counted in the current window (a window older than `windowMs` starts again at 1) and returns the new
 * count, or null when the limit is already reached. Concurrent callers queue on the row lock, so no more than
 * `max` of them can ever get a reservation in one window — the check and the count cannot drift apart.
 */
export async function reserveAttempt({ key, windowMs, max }: { key: string; windowMs: number; max: number }): Promise<number | null> {
  // Passed as text with a cast: the driver does not serialise a Date inside a raw SQL fragment.
  const windowStart = sql`${new Date(Date.now() - windowMs).toISOString()}::timestamptz`;
  const expired = sql`${signInAttempts.windowStart} < ${windowStart}`;
  const [row] = await getDb()
    .insert(signInAttempts)
    .values({ key, failures: 1, windowStart: new Date() })
    .onConflictDoUpdate({
      target: signInAttempts.key,
      set: {
        failures: sql`CASE WHEN ${expired} THEN 1 ELSE ${signInAttempts.failures} + 1 END`,
        windowStart: sql`CASE WHEN ${expired} THEN now() ELSE ${signInAttempts.windowStart} END`,
      },
      setWhere: sql`${expired} OR ${signInAttempts.failures} < ${max}`,
    })
    .returning({ failures: signInAttempts.failures });
  return row ? row.failures : null;
}

/** Gives back one reservation (an attempt that turned out to be a success). */
export async function releaseAttempt({ key }: { key: string }) {
  await getDb()
    .update(signInAttempts)
    .set({ failures: sql`greatest(${signInAttempts.failures} - 1, 0)` })
    .where(eq(signInAttempts.key, key));
}

export async function clearFailedSignIns({ key }: { key: string }) {
  await getDb().delete(signInAttempts).where(eq(signInAttempts.key, key));
}
