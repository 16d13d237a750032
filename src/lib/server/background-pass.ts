import "server-only";
/**
 * The loop every background pass of the web server runs in (the outbox, the look-ahead notices, the forecast
 * e-mails): one pass every `everyMs`, never two at once, an error logged once per distinct message (the database
 * may be away for a while) and the loop kept alive; one loop per name per process even if register() runs twice,
 * and never the reason a process stays alive.
 */
import { describeError } from "./log";

const timers = ((globalThis as unknown as { __pourlinePasses?: Map<string, ReturnType<typeof setInterval>> }).__pourlinePasses ??= new Map());

export function startBackgroundPass(name: string, everyMs: number, pass: () => Promise<unknown>) {
  if (timers.has(name)) return;
  let busy = false;
  let lastError = "";
  const timer = setInterval(async () => {
    if (busy) return;
    busy = true;
    try {
      await pass();
      lastError = "";
    } catch (e) {
      const msg = describeError(e);
      if (msg !== lastError) console.error(`[pourline] ${name} pass failed: ${msg}`);
      lastError = msg;
    } finally {
      busy = false;
    }
  }, everyMs);
  timer.unref?.();
  timers.set(name, timer);
}
