import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { connection } from "next/server";
import { listOutbox } from "@db/queries/mail";
import { requireUser } from "@/lib/server/access";
import { listMailboxFor, mailCatcherPageEnabled } from "@/lib/server/mailbox";
import { formatDateTime } from "@/lib/format";

export const metadata: Metadata = { title: "Dev mailbox" };

const URL_RE = /(https?:\/\/[^\s<>"]+)/g;

/** Plain text with its http(s) links made clickable; the HTML part is never rendered (it is user-influenced). */
function Linked({ text }: { text: string }) {
  return (
    <>
      {text.split(URL_RE).map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="break-all text-brand-700 underline">
            {part}
          </a>
        ) : (
          <span key={i}>{part}</span>
        ),
      )}
    </>
  );
}

const STATUS_TONE: Record<string, string> = {
  sent: "bg-brand-50 text-brand-800",
  pending: "bg-warn-bg text-warn",
  failed: "bg-bad-bg text-bad",
};

/**
 * The signed-in person's own mail, as caught by the local mail catcher, and the outbox rows addressed to them.
 * Exists only when switched on for local use (mailCatcherPageEnabled); otherwise, and when signed out, a 404.
 * Nobody sees mail addressed to anyone else: reset and invitation links are bearer secrets.
 */
export default async function DevMailboxPage() {
  await connection();
  if (!mailCatcherPageEnabled()) notFound();
  const { user } = await requireUser().catch(() => notFound());
  const [messages, outbox] = [listMailboxFor(user.email).slice(0, 100), await listOutbox({ toAddress: user.email, limit: 100 })];
  return (
    <div className="space-y-6">
      <div>
        <h1>Dev mailbox</h1>
        <p className="mt-1 text-sm text-muted">E-mails to you ({user.email}) caught by the local fake SMTP server, newest first, and their place in the outbox. Nothing here leaves this machine; nobody sees anyone else’s mail.</p>
      </div>
      <section className="card scroll-x p-0" aria-labelledby="outbox-heading">
        <h2 id="outbox-heading" className="px-5 pt-4">
          Outbox
        </h2>
        {outbox.length === 0 ? (
          <p className="px-5 py-4 text-sm text-muted">The outbox is empty.</p>
        ) : (
          <table className="mt-3 w-full min-w-[720px] border-collapse" data-testid="outbox-table">
            <thead>
              <tr>
                <th className="table-head">To</th>
                <th className="table-head">Subject</th>
                <th className="table-head">Status</th>
                <th className="table-head">Attempts</th>
                <th className="table-head">Last error</th>
                <th className="table-head">Queued</th>
              </tr>
            </thead>
            <tbody>
              {outbox.map((m) => (
                <tr key={m.id}>
                  <td className="table-cell">{m.toAddress}</td>
                  <td className="table-cell">{m.subject}</td>
                  <td className="table-cell">
                    <span className={`badge ${STATUS_TONE[m.status] ?? ""}`}>{m.status}</span>
                    {m.status === "pending" && m.attempts > 0 && <span className="block text-xs text-muted">next try {formatDateTime(m.nextAttemptAt)}</span>}
                  </td>
                  <td className="table-cell">{m.attempts}</td>
                  <td className="table-cell text-xs text-bad">{m.lastError ?? ""}</td>
                  <td className="table-cell text-xs">{formatDateTime(m.createdAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <section aria-labelledby="received-heading" className="space-y-3">
        <h2 id="received-heading">Received ({messages.length})</h2>
        {messages.length === 0 && <p className="text-sm text-muted">No messages yet.</p>}
        {messages.map((m) => (
          <article key={m.id} className="card" data-testid="caught-message">
            <header className="flex flex-wrap items-baseline justify-between gap-2">
              <h3 className="text-base">{m.subject || "(no subject)"}</h3>
              <time className="text-xs text-muted" dateTime={m.receivedAt}>
                {formatDateTime(m.receivedAt)}
              </time>
            </header>
            <p className="mt-1 text-sm text-muted">
              To {m.to.join(", ")} · from {m.from}
            </p>
            <pre className="mt-3 whitespace-pre-wrap font-sans text-sm">
              <Linked text={m.text} />
            </pre>
          </article>
        ))}
      </section>
    </div>
  );
}
