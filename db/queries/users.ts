import "server-only";
import { eq, sql } from "drizzle-orm";
import { getDb } from "../client";
import { signInAttempts, users } from "../schema";

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

/**
 * Records one failed sign-in for `key` and returns the failures inside the current window.
 * The window restarts when it is older than `windowMs`; done in one statement so concurrent
 * attempts cannot both slip under the limit.
 */
export async function recordFailedSignIn({ key, windowMs }: { key: string; windowMs: number }): Promise<number> {
  // Passed as text with a cast: the driver does not serialise a Date inside a raw SQL fragment.
  const windowStart = sql`${new Date(Date.now() - windowMs).toISOString()}::timestamptz`;
  const [row] = await getDb()
    .insert(signInAttempts)
    .values({ key, failures: 1, windowStart: new Date() })
    .onConflictDoUpdate({
      target: signInAttempts.key,
      set: {
        failures: sql`CASE WHEN ${signInAttempts.windowStart} < ${windowStart} THEN 1 ELSE ${signInAttempts.failures} + 1 END`,
        windowStart: sql`CASE WHEN ${signInAttempts.windowStart} < ${windowStart} THEN now() ELSE ${signInAttempts.windowStart} END`,
      },
    })
    .returning({ failures: signInAttempts.failures });
  return row.failures;
}

export async function getFailedSignIns({ key, windowMs }: { key: string; windowMs: number }): Promise<number> {
  const [row] = await getDb().select().from(signInAttempts).where(eq(signInAttempts.key, key));
  if (!row || row.windowStart.getTime() < Date.now() - windowMs) return 0;
  return row.failures;
}

export async function clearFailedSignIns({ key }: { key: string }) {
  await getDb().delete(signInAttempts).where(eq(signInAttempts.key, key));
}
