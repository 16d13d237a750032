import "server-only";
import { getDb } from "@db/client";
import { insertClosurePublication, listClosureSubscribers } from "@db/queries/closure-notices";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { createShareLink } from "@db/queries/shares";
import type { RunSummary } from "@sim/index";
import { closureLocalTimes, hoursSince } from "@/lib/exports/closures";
import { todayIn } from "@/lib/progress-schema";
import { AppError } from "./errors";
import { closuresOfRun } from "./exports";
import { enqueueMailsFor } from "./mail/outbox";
import { closureNoticeMail } from "./closure-notice-mail";
import { validateDefinition } from "./scenario-input";
import { newShareToken } from "./share-token";

const FEED_DAYS = 365;
/** The notice lists this many of the closures from today on; the feed carries them all, the advisory those ahead. */
const NOTICE_LINES = 12;

/** Placeholders for the links in a preview: publishing creates them, so the preview names them in words. */
const PREVIEW_LINKS = { feedUrl: "(a new calendar link, created when you publish)", advisoryUrl: "(a new travel advisory link, created when you publish)" };

/**
 * What a publication of the latest run would send — the same text the preview shows and the outbox gets.
 * Refused, like publishing, when there is no run or it is stale.
 */
async function draftPublication(scenario: ScenarioDetail, links: { feedUrl: string; advisoryUrl: string }) {
  const run = await getLatestRun({ scenarioId: scenario.id });
  if (!run) throw new AppError("conflict", "Run the scenario before publishing its closures.");
  if (run.scenarioVersion !== scenario.version) throw new AppError("conflict", "The latest run is stale (the plan changed since). Run it again before publishing closures.");
  const definition = validateDefinition(scenario.definition);
  const closures = closuresOfRun(run.results as unknown as RunSummary);
  const [project, subscribers] = await Promise.all([getProject({ id: scenario.projectId }), listClosureSubscribers({ projectId: scenario.projectId })]);
  // A plan run months ago still lists its first closures; people are told what lies ahead of today (where the work is).
  const today = todayIn(definition.timeZone);
  const ahead = closures.filter((c) => c.end > hoursSince(definition.startDate, `${today}T00:00`));
  const upcoming = ahead.slice(0, NOTICE_LINES).map((c) => ({ ...closureLocalTimes(c, definition.startDate), name: c.name, lanes: c.lanes, kind: c.kind }));
  const mail = (to: string) =>
    closureNoticeMail({ to, structure: project?.structureName ?? scenario.name, timeZone: definition.timeZone, count: closures.length, ahead: ahead.length, today, upcoming, ...links });
  return { run, closures, subscribers, mail };
}

/**
 * The notice exactly as publishing would send it, for the confirmation people see first: the run it comes
 * from, the recipients, subject and text. Publishing names that run, so what was previewed is what goes out.
 */
export async function previewClosurePlan({ scenario }: { scenario: ScenarioDetail }) {
  const d = await draftPublication(scenario, PREVIEW_LINKS);
  const sample = d.mail(d.subscribers[0]?.email ?? "");
  return { runId: d.run.id, closureCount: d.closures.length, to: d.subscribers.map((s) => s.email), subject: sample.subject, text: sample.text };
}

/**
 * Publishing a closure plan: a read-only calendar feed and travel advisory (a share link of their own, so they
 * can be revoked like any other), the publication record and one notice per subscriber — all in one
 * transaction, so either everyone is told about a recorded publication or nothing happened. `runId` is the run
 * the user previewed; a newer run since then is refused rather than sent unseen.
 */
export async function publishClosurePlan({ scenario, userId, baseUrl, runId }: { scenario: ScenarioDetail; userId: string; baseUrl: string; runId?: string }) {
  const { token, tokenHash } = newShareToken();
  const links = { feedUrl: `${baseUrl}/api/shared/${token}/closures.ics`, advisoryUrl: `${baseUrl}/advisory/${token}` };
  const d = await draftPublication(scenario, links);
  if (runId !== undefined && runId !== d.run.id) throw new AppError("conflict", "The plan was run again after your preview. Look at the new preview before publishing.");
  return getDb().transaction(async (tx) => {
    const link = await createShareLink({ tx, scenarioId: scenario.id, tokenHash, label: "Closure calendar feed", scope: "closure-feed", userId, expiresAt: new Date(Date.now() + FEED_DAYS * 86_400_000) });
    const publication = await insertClosurePublication({ tx, scenarioId: scenario.id, runId: d.run.id, shareLinkId: link.id, closureCount: d.closures.length, notified: d.subscribers.length, userId });
    await enqueueMailsFor(
      tx,
      { userId, projectId: scenario.projectId },
      d.subscribers.map((s) => d.mail(s.email)),
    );
    return { id: publication.id, publishedAt: publication.publishedAt, closureCount: d.closures.length, notified: d.subscribers.length, ...links };
  });
}
