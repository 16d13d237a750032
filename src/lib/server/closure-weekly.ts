import "server-only";
/**
 * The weekly closure e-mail: once a week, on the day and after the hour a project's team chose (the published plan's
 * time zone), the week ahead of the project's standing publication — what every calendar feed and travel advisory of
 * it shows — goes to its closure-notice subscribers, day by day with the expected backups. A week with no closure
 * sends nothing. One transaction claims the day, keeps the day's note and queues the e-mails, so a week is sent whole
 * or not at all, and never twice. It sends only what a person already published: nothing new is decided here.
 * Started by src/instrumentation.ts (POURLINE_CLOSURE_WEEKLY=off disables it; POURLINE_NOTICE_INTERVAL_MS sets the pace).
 */
import { listClosureSubscribers } from "@db/queries/closure-notices";
import { claimClosureWeeklyDay, listClosureWeeklyProjects } from "@db/queries/closure-weekly";
import { inTransaction } from "@db/queries/mail";
import { getPublishedPlan } from "@db/queries/published-plans";
import type { RunSummary } from "@sim/index";
import { parseScenario } from "@sim/validate";
import { buildAdvisory } from "@/lib/advisory";
import { daysOfWeek, weekSummary, weeklyDueDay, WEEK_DAYS } from "@/lib/closure-weekly";
import { formatIsoDate } from "@/lib/format";
import { eachItemOnItsOwn, startBackgroundPass } from "./background-pass";
import { closureWeeklyMail } from "./mail/closure-weekly-mail";
import { enqueueMail } from "./mail/outbox";

/** One pass: each project whose week was looked at, with the day's note (the tests read it; the Share page reads the note). */
export async function sendWeeklyClosureEmails(now = new Date()): Promise<{ projectId: string; note: string; sent: number }[]> {
  const done: { projectId: string; note: string; sent: number }[] = [];
  await eachItemOnItsOwn("weekly closure e-mail", await listClosureWeeklyProjects(), (p) => p.projectId, async (p) => {
    // Nothing published, or not its day yet: most passes end here, without reading a run.
    if (!p.publicationId || p.day === null || p.hour === null) return;
    const timeZone = p.timeZone ?? "UTC";
    const day = weeklyDueDay({ now, timeZone, weekday: p.day, hour: p.hour, lastOn: p.lastOn });
    if (day === null) return;
    const plan = await getPublishedPlan({ publicationId: p.publicationId });
    const parsed = plan && parseScenario(plan.definition);
    if (!plan || !parsed?.ok) return; // withdrawn meanwhile, or a plan this version cannot read: nothing to say
    const days = daysOfWeek(buildAdvisory(parsed.scenario, plan.results as unknown as RunSummary, day, WEEK_DAYS) ?? [], day);
    const anyClosure = days.some((d) => d.closures.length > 0);
    const subscribers = anyClosure ? await listClosureSubscribers({ projectId: p.projectId }) : [];
    const week = weekSummary(days, day);
    const note =
      subscribers.length > 0
        ? `On ${formatIsoDate(day)}: sent to ${subscribers.length} subscriber${subscribers.length === 1 ? "" : "s"} — ${week}.`
        : anyClosure
          ? `On ${formatIsoDate(day)}: nobody is on the list, so nothing was sent (${week}).`
          : `On ${formatIsoDate(day)}: nothing sent — ${week}.`;
    const claimed = await inTransaction(async (tx) => {
      if (!(await claimClosureWeeklyDay({ tx, projectId: p.projectId, day, note }))) return false;
      for (const s of subscribers) {
        await enqueueMail(tx, closureWeeklyMail({ to: s.email, structure: plan.structureName || plan.projectName, projectName: plan.projectName, timeZone, day, days, publishedAt: plan.publishedAt }));
      }
      return true;
    });
    if (claimed) done.push({ projectId: p.projectId, note, sent: subscribers.length }); // once committed
  });
  return done;
}

export function startClosureWeeklyPoller() {
  startBackgroundPass("weekly closure e-mails", Math.max(1_000, Number(process.env.POURLINE_NOTICE_INTERVAL_MS || 60_000)), () => sendWeeklyClosureEmails());
}
