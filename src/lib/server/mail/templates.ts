import "server-only";
/**
 * The e-mails Pourline sends, each as plain text plus a simple HTML version carrying the same words and
 * link. Every value put into HTML is escaped: names and labels are typed by users.
 */
import { ROLE_LABELS, type ProjectRole } from "@/lib/permissions";
import type { MailMessage } from "./outbox";

function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

const dateFmt = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone: "UTC", timeZoneName: "short" });

function html(paragraphs: string[], link: string, button: string): string {
  const body = paragraphs.map((p) => `<p>${esc(p)}</p>`).join("\n");
  return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5">\n${body}\n<p><a href="${esc(link)}">${esc(button)}</a></p>\n<p style="color:#666;font-size:12px">${esc(link)}</p>\n</body></html>`;
}

export function invitationMail(v: { to: string; projectName: string; role: ProjectRole; inviterName: string; link: string; expiresAt: Date }): MailMessage {
  const lines = [
    `${v.inviterName} has invited you to the project "${v.projectName}" on Pourline as ${ROLE_LABELS[v.role]}.`,
    `Open the link below to accept. It works once and expires on ${dateFmt.format(v.expiresAt)}.`,
  ];
  return {
    to: v.to,
    subject: `You are invited to ${v.projectName} on Pourline`,
    text: `${lines.join("\n\n")}\n\n${v.link}\n\nIf you did not expect this, you can ignore this e-mail.\n`,
    html: html([...lines], v.link, "Accept the invitation"),
  };
}

export function passwordResetMail(v: { to: string; name: string; link: string }): MailMessage {
  const lines = [
    `Hello ${v.name},`,
    "someone asked to reset the password of your Pourline account. Open the link below within one hour to choose a new one. It works once.",
    "If it was not you, ignore this e-mail: your password stays as it is.",
  ];
  return {
    to: v.to,
    subject: "Reset your Pourline password",
    text: `${lines.join("\n\n")}\n\n${v.link}\n`,
    html: html(lines, v.link, "Choose a new password"),
  };
}

export function searchLinkMail(v: { to: string; searchName: string; scenarioName: string; senderName: string; label: string; link: string; expiresAt: Date }): MailMessage {
  const lines = [
    `${v.senderName} has shared the Pourline plan search "${v.searchName}" (on the scenario "${v.scenarioName}") with you${v.label ? ` (${v.label})` : ""}.`,
    `The link shows the plans it compared — finish, delay and cost, and which plans no other beats — read-only, without signing in. It works until ${dateFmt.format(v.expiresAt)}.`,
  ];
  return {
    to: v.to,
    subject: `Plan search shared with you: ${v.searchName}`,
    text: `${lines.join("\n\n")}\n\n${v.link}\n`,
    html: html(lines, v.link, "Open the plan search"),
  };
}

export function shareLinkMail(v: { to: string; scenarioName: string; senderName: string; label: string; link: string; expiresAt: Date }): MailMessage {
  const lines = [
    `${v.senderName} has shared the Pourline scenario "${v.scenarioName}" with you${v.label ? ` (${v.label})` : ""}.`,
    `The link shows its inputs and latest results, read-only, without signing in. It works until ${dateFmt.format(v.expiresAt)}.`,
  ];
  return {
    to: v.to,
    subject: `Scenario shared with you: ${v.scenarioName}`,
    text: `${lines.join("\n\n")}\n\n${v.link}\n`,
    html: html(lines, v.link, "Open the scenario"),
  };
}
