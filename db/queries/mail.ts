import "server-only";
/**
 * The e-mail outbox: rows are written inside the transaction of whatever caused the e-mail, and a poller
 * claims due rows, sends them and records the outcome. A claimed row stays `pending` with its
 * `next_attempt_at` pushed forward by a lease, so a process that dies mid-send leaves the row to be
 * retried once the lease runs out instead of losing it.
 */
import { and, asc, count, desc, eq, gte, inArray, lte, sql } from "drizzle-orm";
import { getDb, type Database } from "../client";
import { emailOutbox } from "../schema";

/** The handle a `getDb().transaction(...)` callback receives. */
export type DbTx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type Executor = Database | DbTx;

/** Runs `fn` in one transaction of the app's pool. */
export function inTransaction<T>(fn: (tx: DbTx) => Promise<T>): Promise<T> {
  return getDb().transaction(fn);
}

export async function insertOutboxMessage({ tx, to, subject, text, html, requestedById = null, projectId = null }: { tx: Executor; to: string; subject: string; text: string; html?: string | null; requestedById?: string | null; projectId?: string | null }) {
  const [row] = await tx
    .insert(emailOutbox)
    .values({ toAddress: to, subject, textBody: text, htmlBody: html ?? null, requestedById, projectId })
    .returning({ id: emailOutbox.id });
  return row;
}

/**
 * E-mails queued since `since` by a user and on a project, counted after taking a transaction-scoped lock per
 * user and per project (always in that order, so two senders cannot deadlock). The locks are held until the
 * caller's transaction ends, so a concurrent sender waits and then counts this transaction's rows too: the
 * quota cannot be overshot by requests arriving at once.
 */
export async function lockAndCountRecentMail({ tx, userId, projectId, since }: { tx: DbTx; userId: string; projectId: string | null; since: Date }) {
  await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtext(${`mail-quota:user:${userId}`}))`);
  if (projectId) await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtext(${`mail-quota:project:${projectId}`}))`);
  const [byUser] = await tx.select({ n: count() }).from(emailOutbox).where(and(eq(emailOutbox.requestedById, userId), gte(emailOutbox.createdAt, since)));
  const [byProject] = projectId ? await tx.select({ n: count() }).from(emailOutbox).where(and(eq(emailOutbox.projectId, projectId), gte(emailOutbox.createdAt, since))) : [{ n: 0 }];
  return { byUser: byUser.n, byProject: byProject.n };
}

/**
 * Claims up to `limit` due rows. `FOR UPDATE SKIP LOCKED` lets several pollers (or app instances) run at
 * once without claiming the same row; the lease is what keeps it claimed after this statement commits.
 */
export async function claimDueMail({ db = getDb(), now, leaseUntil, limit }: { db?: Database; now: Date; leaseUntil: Date; limit: number }) {
  const due = db
    .select({ id: emailOutbox.id })
    .from(emailOutbox)
    .where(and(eq(emailOutbox.status, "pending"), lte(emailOutbox.nextAttemptAt, now)))
    .orderBy(asc(emailOutbox.nextAttemptAt))
    .limit(limit)
    .for("update", { skipLocked: true });
  return db
    .update(emailOutbox)
    .set({ nextAttemptAt: leaseUntil })
    .where(inArray(emailOutbox.id, due))
    .returning({
      id: emailOutbox.id,
      toAddress: emailOutbox.toAddress,
      subject: emailOutbox.subject,
      textBody: emailOutbox.textBody,
      htmlBody: emailOutbox.htmlBody,
      attempts: emailOutbox.attempts,
    });
}

export async function markMailSent({ db = getDb(), id, at }: { db?: Database; id: string; at: Date }) {
  await db.update(emailOutbox).set({ status: "sent", sentAt: at, lastError: null }).where(eq(emailOutbox.id, id));
}

export async function markMailFailed({ db = getDb(), id, attempts, error, nextAttemptAt, giveUp }: { db?: Database; id: string; attempts: number; error: string; nextAttemptAt: Date; giveUp: boolean }) {
  await db
    .update(emailOutbox)
    .set({ attempts, lastError: error.slice(0, 2000), nextAttemptAt, status: giveUp ? "failed" : "pending" })
    .where(eq(emailOutbox.id, id));
}

export async function getOutboxMessage({ db = getDb(), id }: { db?: Database; id: string }) {
  const [row] = await db.select().from(emailOutbox).where(eq(emailOutbox.id, id));
  return row ?? null;
}

/** Outbox rows addressed to one person (the dev mailbox shows nobody anyone else's mail). */
export async function listOutbox({ toAddress, limit = 50 }: { toAddress: string; limit?: number }) {
  return getDb()
    .select({
      id: emailOutbox.id,
      toAddress: emailOutbox.toAddress,
      subject: emailOutbox.subject,
      status: emailOutbox.status,
      attempts: emailOutbox.attempts,
      lastError: emailOutbox.lastError,
      nextAttemptAt: emailOutbox.nextAttemptAt,
      createdAt: emailOutbox.createdAt,
      sentAt: emailOutbox.sentAt,
    })
    .from(emailOutbox)
    .where(eq(sql`lower(${emailOutbox.toAddress})`, toAddress.trim().toLowerCase()))
    .orderBy(desc(emailOutbox.createdAt), desc(emailOutbox.id))
    .limit(limit);
}
