import "server-only";
/**
 * The weekly e-mail to the public-information team and partner agencies: the week ahead of the closure plan
 * published last (what every calendar feed and travel advisory of the project shows), day by day, with the expected
 * backups — the travel advisory's days (src/lib/advisory.ts) in a message.
 */
import { type AdvisoryDay } from "@/lib/advisory";
import { weekDayLines, weekSummary } from "@/lib/closure-weekly";
import { formatDateTimeIn, formatIsoDay } from "@/lib/format";
import type { MailMessage } from "./outbox";

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

export function closureWeeklyMail(v: { to: string; structure: string; projectName: string; timeZone: string; day: string; days: AdvisoryDay[]; publishedAt: Date }): MailMessage {
  const intro = `Planned lane closures on ${v.structure} in the week ahead: ${weekSummary(v.days, v.day)}, from the closure plan published ${formatDateTimeIn(v.publishedAt, v.timeZone)}. Times are local (${v.timeZone}) planning estimates and will move with weather and progress; signs at the work zone always come first.`;
  const days = v.days.map(weekDayLines);
  const follow = "The calendar feed and the travel advisory linked in the closure notice show every closure and follow each new publication.";
  const foot = `You receive this weekly because the "${v.projectName}" team lists you for closure notices; ask them to take you off the list.`;
  const text = [intro, "", ...days.flatMap((d) => [...d, ""]), follow, "", foot, ""].join("\n");
  const html = `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5">
<p>${esc(intro)}</p>
${days.map(([head, ...rest]) => `<p><strong>${esc(head)}</strong><br>${rest.map((l) => esc(l.trim())).join("<br>")}</p>`).join("\n")}
<p>${esc(follow)}</p>
<p style="color:#555;font-size:13px">${esc(foot)}</p>
</body></html>`;
  return { to: v.to, subject: `Lane closures in the week ahead: ${v.structure}, from ${formatIsoDay(v.day)}`, text, html };
}
