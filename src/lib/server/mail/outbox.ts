import "server-only";
/**
 * The durable outbox. `enqueueMail` only inserts a row, inside the caller's transaction, so an e-mail
 * exists exactly when the change that caused it was committed. `processOutbox` sends what is due: success
 * marks the row `sent`; a failure counts an attempt, keeps the error and waits twice as long as last time
 * before the next try; after MAX_ATTEMPTS the row is `failed` and stays visible on the dev mailbox page.
 */
import type { Database } from "@db/client";
import { claimDueMail, insertOutboxMessage, lockAndCountRecentMail, markMailFailed, markMailSent, type DbTx, type Executor } from "@db/queries/mail";
import { AppError } from "../errors";
import { mailFrom, mailTransport } from "./transport";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string | null;
}

export const MAX_ATTEMPTS = 8;
const BASE_DELAY_MS = 15_000;
const MAX_DELAY_MS = 60 * 60_000;
/** Longer than any one send can take with the transport's timeouts, so a live claim never expires early. */
const LEASE_MS = 2 * 60_000;

/** Delay before the next try after `attempts` failures: 15 s, 30 s, 1 min … capped at 1 h. */
export function retryDelayMs(attempts: number): number {
  return Math.min(MAX_DELAY_MS, BASE_DELAY_MS * 2 ** Math.max(0, attempts - 1));
}

/** Mail not caused by a signed-in person (password resets, which have limits of their own). */
export async function enqueueMail(tx: Executor, message: MailMessage) {
  return insertOutboxMessage({ tx, to: message.to, subject: message.subject, text: message.text, html: message.html });
}

/** Outgoing e-mail a person may cause in an hour, and a project may cause in an hour (all its members together). */
export const MAIL_QUOTA = { perUserPerHour: 50, perProjectPerHour: 200 } as const;
const QUOTA_WINDOW_MS = 60 * 60 * 1000;

/**
 * Queues e-mails a signed-in person caused on a project, all or none: inside the caller's transaction it
 * counts what this person and this project queued in the last hour (serialised per person and per project,
 * see lockAndCountRecentMail) and refuses with a 429 naming the quota when the batch would go past it —
 * before anything is written, so the caller's transaction rolls back whole.
 */
export async function enqueueMailsFor(tx: DbTx, sender: { userId: string; projectId: string }, messages: MailMessage[]) {
  if (messages.length === 0) return;
  const { byUser, byProject } = await lockAndCountRecentMail({ tx, userId: sender.userId, projectId: sender.projectId, since: new Date(Date.now() - QUOTA_WINDOW_MS) });
  if (byUser + messages.length > MAIL_QUOTA.perUserPerHour) {
    throw new AppError(
      "too_many",
      `E-mail quota reached: you may send ${MAIL_QUOTA.perUserPerHour} e-mails per hour and have sent ${byUser} in the last hour, so these ${messages.length} cannot go out now. Try again later or send to fewer people.`,
      [],
      { quota: "per-user-per-hour", limit: MAIL_QUOTA.perUserPerHour, used: byUser },
    );
  }
  if (byProject + messages.length > MAIL_QUOTA.perProjectPerHour) {
    throw new AppError(
      "too_many",
      `E-mail quota reached: a project may send ${MAIL_QUOTA.perProjectPerHour} e-mails per hour and this one has sent ${byProject} in the last hour, so these ${messages.length} cannot go out now. Try again later.`,
      [],
      { quota: "per-project-per-hour", limit: MAIL_QUOTA.perProjectPerHour, used: byProject },
    );
  }
  for (const m of messages) {
    await insertOutboxMessage({ tx, to: m.to, subject: m.subject, text: m.text, html: m.html, requestedById: sender.userId, projectId: sender.projectId });
  }
}

export interface OutboxReport {
  sent: number;
  failed: number;
}

/** One pass over the due rows. `db` and `now` exist for tests; the app uses its pool and the clock. */
export async function processOutbox({ db, now = new Date(), limit = 20 }: { db?: Database; now?: Date; limit?: number } = {}): Promise<OutboxReport> {
  const rows = await claimDueMail({ db, now, leaseUntil: new Date(now.getTime() + LEASE_MS), limit });
  const report: OutboxReport = { sent: 0, failed: 0 };
  for (const row of rows) {
    try {
      await mailTransport().sendMail({ from: mailFrom(), to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody ?? undefined });
      await markMailSent({ db, id: row.id, at: new Date() });
      report.sent++;
    } catch (e) {
      const attempts = row.attempts + 1;
      await markMailFailed({
        db,
        id: row.id,
        attempts,
        error: e instanceof Error ? e.message : String(e),
        nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)),
        giveUp: attempts >= MAX_ATTEMPTS,
      });
      report.failed++;
    }
  }
  return report;
}
