import "server-only";
/**
 * The SMTP connection, configured from the environment: SMTP_HOST (default 127.0.0.1), SMTP_PORT (default
 * 2525, the local mail catcher), optional SMTP_USER / SMTP_PASSWORD, SMTP_SECURE=1 for implicit TLS, and
 * MAIL_FROM for the sender. Read once per module instance, i.e. once per server process.
 */
import nodemailer, { type Transporter } from "nodemailer";

let transport: Transporter | null = null;

export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Pourline <no-reply@pourline.invalid>";
}

export function mailTransport(): Transporter {
  if (!transport) {
    const user = process.env.SMTP_USER;
    transport = nodemailer.createTransport({
      host: process.env.SMTP_HOST || "127.0.0.1",
      port: Number(process.env.SMTP_PORT || 2525),
      secure: process.env.SMTP_SECURE === "1",
      auth: user ? { user, pass: process.env.SMTP_PASSWORD ?? "" } : undefined,
      // A dead server must fail the attempt quickly so the outbox can back off, not hang the poller.
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 15_000,
    });
  }
  return transport;
}
