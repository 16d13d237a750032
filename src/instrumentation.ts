/**
 * Runs once per server process. Starts the e-mail outbox poller in the Node.js runtime, unless
 * POURLINE_OUTBOX=off, there is no database configured, or this is the build.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.POURLINE_OUTBOX === "off" || !process.env.DATABASE_URL) return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startOutboxPoller } = await import("./lib/server/mail/poller");
  startOutboxPoller();
}
