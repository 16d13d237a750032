import "server-only";
/**
 * E-mails each new forecast of a project's plan of record — a plan run or a re-forecast the server stands
 * behind, or the newest forecast of a plan newly chosen — once, to the members who asked for it. One transaction per project claims the forecast as announced
 * (only if no other server process did) and queues one outbox e-mail per recipient, so a forecast is announced
 * whole or not at all, and never twice. Archived projects send nothing. Started by src/instrumentation.ts
 * (POURLINE_FORECAST_ALERTS=off disables it; POURLINE_NOTICE_INTERVAL_MS, default 60 s, sets the pace).
 */
import { claimPlanAnnouncement, listUnannouncedPlanForecasts } from "@db/queries/projects";
import { forecastAlertReaders } from "@db/queries/forecast-alerts";
import { inTransaction } from "@db/queries/mail";
import { forecastAlertMail } from "./mail/forecast-alert-mail";
import { enqueueMail } from "./mail/outbox";
import { eachItemOnItsOwn, startBackgroundPass } from "./background-pass";
import { planProgressAndAgainst } from "./plan-progress";
import { publicationLagTexts } from "./closure-notices";

const baseUrl = () => (process.env.APP_BASE_URL || "http://localhost:3000").replace(/\/+$/, "");

/** One pass: the number of projects whose new forecast was announced (to nobody, when nobody asked). */
export async function sendForecastAlerts(): Promise<number> {
  let announced = 0;
  const forecasts = await listUnannouncedPlanForecasts();
  // Read before the transactions: a sentence a second old is as true as one read inside them.
  const [texts, lagging] = await Promise.all([planProgressAndAgainst(forecasts.map((p) => p.planScenarioId)), publicationLagTexts(forecasts)]); // no ids: no query
  // Each project on its own: one whose e-mail cannot be queued must not keep every other project's news back.
  await eachItemOnItsOwn("forecast e-mail", forecasts, (p) => p.projectId, async (p) => {
    // Counted once the transaction has committed: a project whose e-mail failed was not announced.
    const claimed = await inTransaction(async (tx) => {
      if (!(await claimPlanAnnouncement({ tx, projectId: p.projectId, from: p.announcedRunId, to: p.newestRunId! }))) return false;
      const links = { planLink: `${baseUrl()}/scenarios/${p.planScenarioId}`, projectLink: `${baseUrl()}/projects/${p.projectId}` };
      for (const { email: to } of await forecastAlertReaders({ tx, projectId: p.projectId })) {
        const mail = forecastAlertMail({ to, projectName: p.projectName, plan: p, planChanged: p.planChanged, ...(p.planScenarioId ? texts.get(p.planScenarioId) : null), publicationLag: p.planScenarioId ? lagging.get(p.planScenarioId) : null, ...links });
        if (mail) await enqueueMail(tx, mail);
      }
      return true;
    });
    if (claimed) announced++;
  });
  return announced;
}

export function startForecastAlertPoller() {
  startBackgroundPass("forecast e-mails", Math.max(1_000, Number(process.env.POURLINE_NOTICE_INTERVAL_MS || 60_000)), () => sendForecastAlerts());
}
