import "server-only";
/**
 * Sends each enabled look-ahead notice once a day, at or after its local hour (the scenario's time zone):
 * the board is computed first (it may ask the weather service), then one transaction marks the day sent,
 * keeps the compact board for tomorrow's comparison and queues one outbox e-mail per recipient — so a
 * notice is either sent whole or not at all, and never twice for a day. Started by src/instrumentation.ts
 * (POURLINE_LOOKAHEAD_NOTICES=off disables it; POURLINE_NOTICE_INTERVAL_MS, default 60 s, sets the pace).
 */
import { claimNoticeDay, listEnabledNotices } from "@db/queries/look-ahead-notices";
import { inTransaction } from "@db/queries/mail";
import { compactBoard, type CompactBoard } from "@/lib/look-ahead-notice";
import { scenarioLookAhead } from "./look-ahead";
import { localDate, localHour } from "@/lib/local-clock";
import { lookAheadMail } from "./mail/look-ahead-mail";
import { enqueueMail } from "./mail/outbox";
import { eachItemOnItsOwn, startBackgroundPass } from "./background-pass";

export async function sendDueLookAheadNotices(now = new Date()): Promise<number> {
  let sent = 0;
  // One scenario that cannot be read (say, a definition an older version saved) must not stop the others.
  await eachItemOnItsOwn("look-ahead notice", await listEnabledNotices(), (n) => n.scenarioId, async (n) => {
    const tz = typeof (n.definition as { timeZone?: unknown }).timeZone === "string" ? ((n.definition as { timeZone: string }).timeZone) : "America/Chicago";
    const today = localDate(now, tz);
    if (localHour(now, tz) < n.hour || (n.lastSentOn !== null && n.lastSentOn >= today)) return;
    const board = await scenarioLookAhead({ projectId: n.projectId, definition: n.definition }, now);
    const link = `${(process.env.APP_BASE_URL || "http://localhost:3000").replace(/\/+$/, "")}/scenarios/${n.scenarioId}/look-ahead`;
    const compact = compactBoard(board.days);
    const claimed = await inTransaction(async (tx) => {
      if (!(await claimNoticeDay({ tx, scenarioId: n.scenarioId, date: today, board: compact }))) return false;
      for (const to of n.recipients) await enqueueMail(tx, lookAheadMail({ to, scenarioName: n.name, board, previous: (n.lastBoard as CompactBoard | null) ?? null, link }));
      return true;
    });
    if (claimed) sent++; // once committed
  });
  return sent;
}

export function startLookAheadNoticePoller() {
  startBackgroundPass("look-ahead notices", Math.max(1_000, Number(process.env.POURLINE_NOTICE_INTERVAL_MS || 60_000)), () => sendDueLookAheadNotices());
}
