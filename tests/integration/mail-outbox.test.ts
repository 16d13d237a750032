/**
 * The outbox is durable: a message queued while the mail server is unreachable stays `pending`, is retried
 * with the error kept and a growing delay, survives a restart (new module instance, new database
 * connection) and is delivered by the next process once the server answers. Runs in this test process
 * against the test database (TEST_DATABASE_URL), where the running app's own poller never looks, and the
 * live fake SMTP server that `npm test` starts (SMTP_PORT, POURLINE_MAILBOX_DIR).
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createServer } from "node:net";
import { randomUUID } from "node:crypto";
import { runMigrations } from "../../db/migrate";
import { createPool } from "../../db/client";
import { findMail } from "../../src/lib/server/mailbox";

const url = process.env.TEST_DATABASE_URL;
const livePort = process.env.SMTP_PORT;
if (!url || !livePort || !process.env.POURLINE_MAILBOX_DIR) {
  throw new Error("TEST_DATABASE_URL, SMTP_PORT and POURLINE_MAILBOX_DIR must be set: run through `npm test`, which starts the fake SMTP server.");
}

type OutboxModule = typeof import("../../src/lib/server/mail/outbox");
type Pool = ReturnType<typeof createPool>;
const pools: Pool[] = [];

/** A port nothing listens on: bound, noted, released. */
async function deadPort(): Promise<number> {
  return new Promise((res) => {
    const srv = createServer();
    srv.listen(0, "127.0.0.1", () => {
      const port = (srv.address() as { port: number }).port;
      srv.close(() => res(port));
    });
  });
}

/** A fresh copy of the mail modules reading SMTP_PORT anew, as a restarted server would. */
async function freshOutbox(smtpPort: string): Promise<OutboxModule> {
  process.env.SMTP_PORT = smtpPort;
  vi.resetModules();
  return import("../../src/lib/server/mail/outbox");
}

function pool(): Pool {
  const p = createPool(url!, 2);
  pools.push(p);
  return p;
}

async function row(p: Pool, id: string) {
  const [r] = await p.sql`SELECT status, attempts, last_error, next_attempt_at, sent_at FROM email_outbox WHERE id = ${id}`;
  // The drizzle-configured client hands timestamps back as text.
  return {
    status: r.status as string,
    attempts: r.attempts as number,
    last_error: r.last_error as string | null,
    next_attempt_at: new Date(r.next_attempt_at),
    sent_at: r.sent_at == null ? null : new Date(r.sent_at),
  };
}

beforeAll(async () => {
  await runMigrations(url);
});
afterAll(async () => {
  process.env.SMTP_PORT = livePort;
  for (const p of pools) await p.sql.end({ timeout: 5 });
});

describe("e-mail outbox", () => {
  it("keeps a message through failures and a restart, then delivers it once", async () => {
    const subject = `Outbox restart check ${randomUUID()}`;
    const to = "outbox.check@marrin-dot.example";

    // Process 1: the mail server is unreachable.
    const first = await freshOutbox(String(await deadPort()));
    const p1 = pool();
    const { id } = await p1.db.transaction((tx) => first.enqueueMail(tx, { to, subject, text: "Queued while the mail server was down." }));
    expect((await row(p1, id)).status).toBe("pending");

    const t0 = new Date();
    await first.processOutbox({ db: p1.db, now: t0 });
    const afterOne = await row(p1, id);
    expect(afterOne.status).toBe("pending");
    expect(afterOne.attempts).toBe(1);
    expect(afterOne.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(afterOne.next_attempt_at.getTime()).toBe(t0.getTime() + first.retryDelayMs(1));

    // Not due yet: a pass at the same moment leaves it alone.
    await first.processOutbox({ db: p1.db, now: t0 });
    expect((await row(p1, id)).attempts).toBe(1);

    // Once due it is retried, and the next wait is longer.
    const t1 = new Date(afterOne.next_attempt_at.getTime() + 1);
    await first.processOutbox({ db: p1.db, now: t1 });
    const afterTwo = await row(p1, id);
    expect(afterTwo.status).toBe("pending");
    expect(afterTwo.attempts).toBe(2);
    expect(afterTwo.last_error).toBeTruthy();
    expect(afterTwo.next_attempt_at.getTime() - t1.getTime()).toBeGreaterThan(afterOne.next_attempt_at.getTime() - t0.getTime());
    expect(findMail({ to, subject })).toBeNull();

    // "Restart": that process's connection is gone; a new module instance and a new pool take over.
    await p1.sql.end({ timeout: 5 });
    const second = await freshOutbox(livePort!);
    expect(second).not.toBe(first);
    const p2 = pool();
    await second.processOutbox({ db: p2.db, now: new Date(afterTwo.next_attempt_at.getTime() + 1) });
    const delivered = await row(p2, id);
    expect(delivered.status).toBe("sent");
    expect(delivered.sent_at).toBeInstanceOf(Date);
    expect(delivered.attempts).toBe(2);

    const caught = findMail({ to, subject });
    expect(caught?.text).toContain("Queued while the mail server was down.");
    expect(caught?.to).toEqual([to]);

    // A later pass does not send it again.
    await second.processOutbox({ db: p2.db, now: new Date(Date.now() + 86_400_000) });
    expect((await row(p2, id)).status).toBe("sent");
  });

  it("gives up after MAX_ATTEMPTS failures and marks the row failed", async () => {
    const outbox = await freshOutbox(String(await deadPort()));
    const p = pool();
    const { id } = await p.db.transaction((tx) => outbox.enqueueMail(tx, { to: "never.delivered@marrin-dot.example", subject: `Give-up check ${randomUUID()}`, text: "x" }));
    let now = new Date();
    for (let i = 0; i < outbox.MAX_ATTEMPTS; i++) {
      await outbox.processOutbox({ db: p.db, now });
      now = new Date((await row(p, id)).next_attempt_at.getTime() + 1);
    }
    const r = await row(p, id);
    expect(r.status).toBe("failed");
    expect(r.attempts).toBe(outbox.MAX_ATTEMPTS);
    expect(r.last_error).toBeTruthy();
    // A failed row is never claimed again.
    await outbox.processOutbox({ db: p.db, now: new Date(now.getTime() + 86_400_000) });
    expect((await row(p, id)).attempts).toBe(outbox.MAX_ATTEMPTS);
  });

  it("two pollers running at once deliver a message exactly once (FOR UPDATE SKIP LOCKED and the lease)", async () => {
    const outbox = await freshOutbox(livePort!);
    const [a, b] = [pool(), pool()];
    const to = "once.only@marrin-dot.example";
    const subject = `Concurrency check ${randomUUID()}`;
    const { id } = await a.db.transaction((tx) => outbox.enqueueMail(tx, { to, subject, text: "exactly once" }));
    const reports = await Promise.all([outbox.processOutbox({ db: a.db }), outbox.processOutbox({ db: b.db })]);
    expect((await row(a, id)).status).toBe("sent");
    expect(reports[0].sent + reports[1].sent).toBeGreaterThanOrEqual(1);
    const { listMailbox } = await import("../../src/lib/server/mailbox");
    expect(listMailbox().filter((m) => m.subject === subject)).toHaveLength(1);
  });

  it("a rolled-back transaction leaves no e-mail behind", async () => {
    const outbox = await freshOutbox(livePort!);
    const p = pool();
    const subject = `Rollback check ${randomUUID()}`;
    await expect(
      p.db.transaction(async (tx) => {
        await outbox.enqueueMail(tx, { to: "rolled.back@marrin-dot.example", subject, text: "x" });
        throw new Error("the change that caused the e-mail failed");
      }),
    ).rejects.toThrow("the change that caused the e-mail failed");
    const rows = await p.sql`SELECT count(*)::int AS n FROM email_outbox WHERE subject = ${subject}`;
    expect(rows[0].n).toBe(0);
  });
});
