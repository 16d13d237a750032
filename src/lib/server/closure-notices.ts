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

/**
 * Publishing a closure plan: a read-only calendar feed (a share link of its own, so it can be revoked like any
 * other), the publication record and one notice per subscriber — all in one transaction, so either everyone is
 * told about a recorded publication or nothing happened.
 */
export async function publishClosurePlan({ scenario, userId, baseUrl }: { scenario: ScenarioDetail; userId: string; baseUrl: string }) {
  const run = await getLatestRun({ scenarioId: scenario.id });
  if (!run) throw new AppError("conflict", "Run the scenario before publishing its closures.");
  if (run.scenarioVersion !== scenario.version) throw new AppError("conflict", "The latest run is stale (the plan changed since). Run it again before publishing closures.");
  const definition = validateDefinition(scenario.definition);
  const closures = plannedClosures(run.results as unknown as RunSummary, definition);
  const [project, subscribers] = await Promise.all([getProject({ id: scenario.projectId }), listClosureSubscribers({ projectId: scenario.projectId })]);
  const { token, tokenHash } = newShareToken();
  const feedUrl = `${baseUrl}/api/shared/${token}/closures.ics`;
  const upcoming = closures.slice(0, 12).map((c) => ({ ...closureLocalTimes(c, definition.startDate), name: c.name, lanes: c.lanes }));
  return getDb().transaction(async (tx) => {
    const link = await createShareLink({ tx, scenarioId: scenario.id, tokenHash, label: "Closure calendar feed", scope: "closure-feed", userId, expiresAt: new Date(Date.now() + FEED_DAYS * 86_400_000) });
    const publication = await insertClosurePublication({ tx, scenarioId: scenario.id, runId: run.id, shareLinkId: link.id, closureCount: closures.length, notified: subscribers.length, userId });
    await enqueueMailsFor(
      tx,
      { userId, projectId: scenario.projectId },
      subscribers.map((s) => closureNoticeMail({ to: s.email, structure: project?.structureName ?? scenario.name, timeZone: definition.timeZone, count: closures.length, upcoming, feedUrl })),
    );
    return { id: publication.id, publishedAt: publication.publishedAt, closureCount: closures.length, notified: subscribers.length, feedUrl };
  });
}
