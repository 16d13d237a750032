import "server-only";
/**
 * The durable outbox. `enqueueMail` only inserts a row, inside the caller's transaction, so an e-mail
 * exists exactly when the change that caused it was committed. `processOutbox` sends what is due: success
 * marks the row `sent`; a failure counts an attempt, keeps the error and waits twice as long as last time
 * before the next try; after MAX_ATTEMPTS the row is `failed` and stays visible on the dev mailbox page.
 */
import type { Database } from "@db/client";
import { claimDueMail, insertOutboxMessage, markMailFailed, markMailSent, type Executor } from "@db/queries/mail";
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

export async function enqueueMail(tx: Executor, message: MailMessage) {
  return insertOutboxMessage({ tx, to: message.to, subject: message.subject, text: message.text, html: message.html });
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
