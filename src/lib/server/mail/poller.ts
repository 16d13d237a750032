import "server-only";
/**
 * The outbox loop started by src/instrumentation.ts: one pass every POURLINE_OUTBOX_INTERVAL_MS (default 2 s),
 * in the web server's background-pass loop (never two at once, errors logged once, the loop kept alive).
 */
import { processOutbox } from "./outbox";
import { startBackgroundPass } from "../background-pass";

export function startOutboxPoller() {
  startBackgroundPass("outbox", Math.max(200, Number(process.env.POURLINE_OUTBOX_INTERVAL_MS || 2_000)), () => processOutbox());
}
