import "server-only";
/**
 * The loop every background pass of the web server runs in (the outbox, the look-ahead notices, the forecast
 * e-mails, the daily re-forecast, the weekly closure e-mail): one pass every `everyMs`, never two at once, an error
 * logged once per distinct message (the database may be away for a while) and the loop kept alive; one loop per name
 * per process even if register() runs twice, and never the reason a process stays alive. Within a pass, each project
 * is worked on its own (`eachItemOnItsOwn`; the project list's progress sentences go plan by plan through it too).
 */
import { describeError } from "./log";

const timers = ((globalThis as unknown as { __pourlinePasses?: Map<string, ReturnType<typeof setInterval>> }).__pourlinePasses ??= new Map());

/** The last error logged per failing thing (a pass, or one item of a pass): one that keeps failing the same way is reported once. */
const lastLogged = new Map<string, string>();

/** Runs `work`; a throw is logged as "<what> failed: <describeError>" unless `key` last failed the same way. */
async function loggedOnce(key: string, what: string, work: () => Promise<unknown>): Promise<boolean> {
  try {
    await work();
    lastLogged.delete(key);
    return true;
  } catch (e) {
    const msg = describeError(e);
    if (lastLogged.get(key) !== msg) console.error(`[pourline] ${what} failed: ${msg}`);
    lastLogged.set(key, msg);
    return false;
  }
}

export function startBackgroundPass(name: string, everyMs: number, pass: () => Promise<unknown>) {
  if (timers.has(name)) return;
  let busy = false;
  const timer = setInterval(async () => {
    if (busy) return;
    busy = true;
    try {
      await loggedOnce(name, `${name} pass`, pass);
    } finally {
      busy = false;
    }
  }, everyMs);
  timer.unref?.();
  timers.set(name, timer);
}

/**
 * A pass's work, item by item (a project, a scenario): an item that throws is logged — by the pass's name, the
 * item's key and describeError, never the message, which may quote data — once while it keeps failing the same way,
 * and the pass goes on to the next item. One project that cannot be read or written must not stop every other
 * project's e-mail or re-forecast (or, on the project list, every other plan's progress sentence). Returns how many
 * items failed (the tests read it).
 */
export async function eachItemOnItsOwn<T>(pass: string, items: Iterable<T>, keyOf: (item: T) => string, step: (item: T) => Promise<void>): Promise<number> {
  let failed = 0;
  for (const item of items) {
    if (!(await loggedOnce(`${pass}\u0000${keyOf(item)}`, `${pass} for ${keyOf(item)}`, () => step(item)))) failed++;
  }
  return failed;
}
