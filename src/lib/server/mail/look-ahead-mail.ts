import "server-only";
/** The daily look-ahead e-mail: what changed since the last one first, then the whole board, then the link. */
import { formatIsoDay } from "@/lib/format";
import { allClosedSentence, boardLines, changesSince, type CompactBoard } from "@/lib/look-ahead-notice";
import type { LookAheadBoard } from "@/lib/look-ahead-contract";
import type { MailMessage } from "./outbox";

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

export function lookAheadMail(v: { to: string; scenarioName: string; board: LookAheadBoard; previous: CompactBoard | null; link: string }): MailMessage {
  const changes = changesSince(v.previous, v.board.days);
  const head = [
    `The week ahead for "${v.scenarioName}" from ${formatIsoDay(v.board.today, { long: true })}: which shifts of the operations with a weather gate may work, from the weather forecast.`,
    v.board.forecast.message ?? (v.board.forecast.place ? `Forecast for ${v.board.forecast.place}.` : ""),
    allClosedSentence(v.board.days, v.board.nextOpen) ?? "",
    v.previous === null ? "This is the first notice." : changes.length === 0 ? "Nothing changed since the last notice." : "Changed since the last notice:",
  ].filter(Boolean);
  const board = boardLines(v.board.days);
  const foot = [v.board.rainRule, "The limits are planning inputs; the specification and the engineer decide on site."];
  const text = [...head, ...changes.map((c) => `  ${c}`), "", ...board, "", ...foot, "", v.link, ""].join("\n");
  const html = `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5">
${head.map((p) => `<p>${esc(p)}</p>`).join("\n")}
${changes.length ? `<ul>${changes.map((c) => `<li>${esc(c)}</li>`).join("")}</ul>` : ""}
<pre style="font-family:monospace">${esc(board.join("\n"))}</pre>
${foot.map((p) => `<p style="color:#555;font-size:13px">${esc(p)}</p>`).join("\n")}
<p><a href="${esc(v.link)}">Open the look-ahead board</a></p>
</body></html>`;
  return { to: v.to, subject: `Week ahead: ${v.scenarioName} from ${formatIsoDay(v.board.today)}${changes.length ? ` (${changes.length} changed)` : ""}`, text, html };
}
