/**
 * The local stand-in for a mail service (development and tests only). Listens on 127.0.0.1:SMTP_PORT
 * (default 2525) without authentication or TLS, accepts every message and stores each as one JSON file
 * `{id, receivedAt, from, to[], subject, text, html}` in POURLINE_MAILBOX_DIR (default .data/mailbox).
 * Recipients come from the SMTP envelope, so what is stored is who the message was actually sent to.
 * Run: node_modules/.bin/tsx scripts/fake-smtp.ts
 */
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { randomUUID } from "node:crypto";
import { mkdirSync, renameSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";

const port = Number(process.env.SMTP_PORT || 2525);
const dir = resolve(process.env.POURLINE_MAILBOX_DIR || ".data/mailbox");
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["AUTH", "STARTTLS"],
  logger: false,
  banner: "Pourline local mail catcher",
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const receivedAt = new Date();
        const id = randomUUID();
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : (mail.from?.text ?? "");
        const message = {
          id,
          receivedAt: receivedAt.toISOString(),
          from,
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? "",
          text: mail.text ?? "",
          html: typeof mail.html === "string" ? mail.html : null,
        };
        // Written aside and renamed so a reader never sees half a file.
        const name = `${receivedAt.getTime()}-${id}.json`;
        const tmp = join(dir, `.${name}.tmp`);
        writeFileSync(tmp, JSON.stringify(message, null, 2));
        renameSync(tmp, join(dir, name));
        callback();
      })
      .catch((e: Error) => callback(e));
  },
});

server.on("error", (e) => console.error(`[fake-smtp] ${e.message}`));
server.listen(port, "127.0.0.1", () => console.log(`fake SMTP listening on ${port}`));

for (const sig of ["SIGINT", "SIGTERM"] as const) process.on(sig, () => server.close(() => process.exit(0)));
