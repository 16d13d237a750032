import "server-only";
import { formatClockOnDay, formatIsoDay } from "@/lib/format";
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
  /** Closure periods that end on or after `today` (local `YYYY-MM-DD`); `upcoming` lists the first of them. */
  ahead: number;
  today: string;
  upcoming: { start: string; end: string; name: string; lanes: string[]; kind?: "short" | "standing" }[];
  feedUrl: string;
  advisoryUrl?: string;
}): MailMessage {
  // Days in words — "Tue 6 Apr 2027 21:00 – 7 Apr 05:00" — not ISO dates: the notice goes to the public.
  const lines = v.upcoming.map((c) => `${formatIsoDay(c.start)} ${c.start.slice(11, 16)} – ${formatClockOnDay(c.end, c.start)}  ${c.name} (${c.lanes.join(", ")} closed${c.kind === "standing" ? " round the clock" : ""})`);
  const periods = (n: number) => `${n.toLocaleString("en-US")} closure period${n === 1 ? "" : "s"}`;
  const ahead = v.count === 0 ? "" : `, ${v.ahead === v.count ? "all of them" : v.ahead.toLocaleString("en-US")} from today (${formatIsoDay(v.today)}) on`;
  const intro = `Planned lane closures for ${v.structure} have been published: ${periods(v.count)} in all${ahead}. Times are local (${v.timeZone}) planning estimates and will move with weather and progress.`;
  const heading = v.upcoming.length === 0 ? "No closure is planned from today on." : v.upcoming.length < v.ahead ? "The next closures:" : "The closures:";
  const follow = "Subscribe to the calendar below to see every closure and follow changes; it updates when the plan is published again.";
  const advisory = v.advisoryUrl ? `Travel advisory for drivers (expected backups and hours to avoid, day by day): ${v.advisoryUrl}` : "";
  return {
    to: v.to,
    subject: `Lane closures planned: ${v.structure}`,
    text: `${intro}\n\n${heading}\n${lines.join("\n")}${lines.length ? "\n" : ""}\n${follow}\n${v.feedUrl}\n${advisory ? `\n${advisory}\n` : ""}`,
    html: `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5"><p>${esc(intro)}</p><p>${esc(heading)}</p>${lines.length ? `<ul>${lines.map((l) => `<li>${esc(l)}</li>`).join("")}</ul>` : ""}<p>${esc(follow)}</p><p><a href="${esc(v.feedUrl)}">Closure calendar</a></p>${v.advisoryUrl ? `<p><a href="${esc(v.advisoryUrl)}">Travel advisory</a></p>` : ""}</body></html>`,
  };
}
