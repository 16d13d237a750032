import "server-only";
import type { MailMessage } from "./mail/outbox";

function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/**
 * The notice to the public-information team and partner agencies: what closes when (each closure period as the
 * delay model counts it — a night closure is one night, a stage closure stands round the clock), a calendar
 * to follow and the travel advisory for drivers.
 */
export function closureNoticeMail(v: {
  to: string;
  structure: string;
  timeZone: string;
  count: number;
  upcoming: { start: string; end: string; name: string; lanes: string[]; kind?: "short" | "standing" }[];
  feedUrl: string;
  advisoryUrl?: string;
}): MailMessage {
  const when = (s: string) => s.replace("T", " ");
  const lines = v.upcoming.map((c) => `${when(c.start)} – ${when(c.end)}  ${c.name} (${c.lanes.join(", ")} closed${c.kind === "standing" ? " round the clock" : ""})`);
  const intro = `Planned lane closures for ${v.structure} have been published: ${v.count} closure period${v.count === 1 ? "" : "s"} in all. Times are local (${v.timeZone}) planning estimates and will move with weather and progress.`;
  const follow = "Subscribe to the calendar below to see every closure and follow changes; it updates when the plan is published again.";
  const advisory = v.advisoryUrl ? `Travel advisory for drivers (expected backups and hours to avoid, day by day): ${v.advisoryUrl}` : "";
  return {
    to: v.to,
    subject: `Lane closures planned: ${v.structure}`,
    text: `${intro}\n\nThe first closures:\n${lines.join("\n")}\n\n${follow}\n${v.feedUrl}\n${advisory ? `\n${advisory}\n` : ""}`,
    html: `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5"><p>${esc(intro)}</p><p>The first closures:</p><ul>${lines.map((l) => `<li>${esc(l)}</li>`).join("")}</ul><p>${esc(follow)}</p><p><a href="${esc(v.feedUrl)}">Closure calendar</a></p>${v.advisoryUrl ? `<p><a href="${esc(v.advisoryUrl)}">Travel advisory</a></p>` : ""}</body></html>`,
  };
}
