import "server-only";
/**
 * The e-mail a member asked for on a project: a new forecast of its plan of record (or a newly chosen plan's
 * newest forecast), in the same words as the project list (src/lib/plan-of-record-text.ts), with links to the plan and to where the e-mails are turned off.
 */
import { planForecastText, type PlanOfRecordView } from "@/lib/plan-of-record-text";
import type { MailMessage } from "./outbox";

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

/**
 * `planChanged`: the project chose another plan of record since the last e-mail; this is the new plan's newest
 * forecast. `progress`: the project list's progress sentence (src/lib/server/plan-progress.ts), when the plan has a field log;
 * `against`: how the job stands against the plan run, when there is one of the plan as it stands; `publicationLag`: the
 * lane closures published for the public came from an earlier forecast than this one.
 */
export function forecastAlertMail(v: {
  to: string;
  projectName: string;
  plan: PlanOfRecordView;
  planChanged: boolean;
  planLink: string;
  projectLink: string;
  progress?: string | null;
  against?: string | null;
  publicationLag?: string | null;
}): MailMessage | null {
  const text = planForecastText(v.plan);
  if (!text || !v.plan.planName) return null;
  const paragraphs = [
    v.planChanged ? `"${v.projectName}" is now run by another plan of record, "${v.plan.planName}". Its forecast:` : `A new forecast of the plan of record of "${v.projectName}":`,
    `${v.plan.planName}: P80 finish ${text.p80}${text.rest}`,
    text.when,
    ...(v.progress ? [v.progress] : []),
    ...(v.against ? [v.against] : []),
    ...(v.publicationLag ? [v.publicationLag] : []),
    "P80: 8 in 10 of the simulated outcomes finish by that date. A forecast is a planning aid; the project specifications and the engineer in charge decide.",
  ];
  const foot = `You receive this because you asked for forecast e-mails on this project. Turn them off on the project page: ${v.projectLink}`;
  return {
    to: v.to,
    subject: `Forecast for ${v.projectName}: P80 finish ${text.p80}`,
    text: `${[...paragraphs, v.planLink, foot].join("\n\n")}\n`,
    html: `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5">
${paragraphs.map((p) => `<p>${esc(p)}</p>`).join("\n")}
<p><a href="${esc(v.planLink)}">Open the plan</a></p>
<p style="color:#555;font-size:13px">You receive this because you asked for forecast e-mails on this project. <a href="${esc(v.projectLink)}">Turn them off on the project page</a>.</p>
</body></html>`,
  };
}
