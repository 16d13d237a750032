import "server-only";
/**
 * The background loop started by src/instrumentation.ts: one outbox pass every POURLINE_OUTBOX_INTERVAL_MS
 * (default 2 s), never two passes at once, errors logged and the loop kept alive. One loop per process even
 * if register() runs twice.
 */
import { processOutbox } from "./outbox";
import { describeError } from "../log";

const state = globalThis as unknown as { __pourlineOutboxTimer?: ReturnType<typeof setInterval> };

export function startOutboxPoller() {
  if (state.__pourlineOutboxTimer) return;
  const everyMs = Math.max(200, Number(process.env.POURLINE_OUTBOX_INTERVAL_MS || 2_000));
  let busy = false;
  let lastError = "";
  const tick = async () => {
    if (busy) return;
    busy = true;
    try {
      await processOutbox();
      lastError = "";
    } catch (e) {
      // The database may be briefly away; say so once per distinct error rather than every tick.
      const msg = describeError(e);
      if (msg !== lastError) console.error(`[pourline] outbox pass failed: ${msg}`);
      lastError = msg;
    } finally {
      busy = false;
    }
  };
  state.__pourlineOutboxTimer = setInterval(tick, everyMs);
  // Never the reason a process stays alive.
  state.__pourlineOutboxTimer.unref?.();
}
