import "server-only";
import { getDb } from "@db/client";
import { insertClosurePublication, listClosureSubscribers } from "@db/queries/closure-notices";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { createShareLink } from "@db/queries/shares";
import type { RunSummary } from "@sim/index";
import { closureLocalTimes, plannedClosures } from "@/lib/exports/closures";
import { AppError } from "./errors";
import { enqueueMailsFor } from "./mail/outbox";
import { closureNoticeMail } from "./closure-notice-mail";
import { validateDefinition } from "./scenario-input";
import { newShareToken } from "./share-token";

const FEED_DAYS = 365;

/** What a publication would send, from the latest run: refused, like publishing, when there is none or it is stale. */
async function closurePlanOf(scenario: ScenarioDetail) {
  const run = await getLatestRun({ scenarioId: scenario.id });
  if (!run) throw new AppError("conflict", "Run the scenario before publishing its closures.");
  if (run.scenarioVersion !== scenario.version) throw new AppError("conflict", "The latest run is stale (the plan changed since). Run it again before publishing closures.");
  const definition = validateDefinition(scenario.definition);
  const closures = plannedClosures(run.results as unknown as RunSummary, definition);
  const [project, subscribers] = await Promise.all([getProject({ id: scenario.projectId }), listClosureSubscribers({ projectId: scenario.projectId })]);
  const upcoming = closures.slice(0, 12).map((c) => ({ ...closureLocalTimes(c, definition.startDate), name: c.name, lanes: c.lanes }));
  const mailTo = (to: string, feedUrl: string) =>
    closureNoticeMail({ to, structure: project?.structureName ?? scenario.name, timeZone: definition.timeZone, count: closures.length, upcoming, feedUrl });
  return { run, closures, subscribers, mailTo };
}

/**
 * The notice exactly as publishing would send it, for the confirmation people see first: recipients, subject and
 * text. The calendar link does not exist yet (publishing creates it), so the text names it in words.
 */
export async function previewClosurePlan({ scenario }: { scenario: ScenarioDetail }) {
  const { closures, subscribers, mailTo } = await closurePlanOf(scenario);
  const sample = mailTo(subscribers[0]?.email ?? "", "(a new calendar link, created when you publish)");
  return { closureCount: closures.length, to: subscribers.map((s) => s.email), subject: sample.subject, text: sample.text };
}

/**
 * Publishing a closure plan: a read-only calendar feed (a share link of its own, so it can be revoked like any
 * other), the publication record and one notice per subscriber — all in one transaction, so either everyone is
 * told about a recorded publication or nothing happened.
 */
export async function publishClosurePlan({ scenario, userId, baseUrl }: { scenario: ScenarioDetail; userId: string; baseUrl: string }) {
  const { run, closures, subscribers, mailTo } = await closurePlanOf(scenario);
  const { token, tokenHash } = newShareToken();
  const feedUrl = `${baseUrl}/api/shared/${token}/closures.ics`;
  return getDb().transaction(async (tx) => {
    const link = await createShareLink({ tx, scenarioId: scenario.id, tokenHash, label: "Closure calendar feed", scope: "closure-feed", userId, expiresAt: new Date(Date.now() + FEED_DAYS * 86_400_000) });
    const publication = await insertClosurePublication({ tx, scenarioId: scenario.id, runId: run.id, shareLinkId: link.id, closureCount: closures.length, notified: subscribers.length, userId });
    await enqueueMailsFor(
      tx,
      { userId, projectId: scenario.projectId },
      subscribers.map((s) => mailTo(s.email, feedUrl)),
    );
    return { id: publication.id, publishedAt: publication.publishedAt, closureCount: closures.length, notified: subscribers.length, feedUrl };
  });
}
