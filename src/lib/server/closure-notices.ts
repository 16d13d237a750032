import "server-only";
import { getDb } from "@db/client";
import { insertClosurePublication, listClosurePublications, listClosureSubscribers, standingPublications } from "@db/queries/closure-notices";
import { getProject } from "@db/queries/projects";
import { getNewestForecast } from "@db/queries/runs";
import { countShiftsNotInRun } from "@db/queries/progress";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { createShareLink } from "@db/queries/shares";
import type { RunSummary } from "@sim/index";
import { closureLocalTimes, hoursSince } from "@/lib/exports/closures";
import { todayIn } from "@/lib/progress-schema";
import { changesNotInText, forecastSourceText, publicationLagText } from "@/lib/plan-of-record-text";
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
 * What a publication of the newest forecast would send — the same text the preview shows and the outbox gets.
 * The newest forecast is the latest plan run or a later re-forecast from the field log (`getNewestForecast`): on a
 * job under way the public hears the closures the field log has moved, not the plan's first guess. Refused, like
 * publishing, when there is no forecast or it is of an earlier version of the plan.
 */
async function draftPublication(scenario: ScenarioDetail, links: { feedUrl: string; advisoryUrl: string }) {
  const run = await getNewestForecast({ scenarioId: scenario.id });
  if (!run) throw new AppError("conflict", "Run the scenario before publishing its closures.");
  if (run.scenarioVersion !== scenario.version) {
    throw new AppError("conflict", `The newest forecast (${forecastSourceText({ dataDate: run.dataDate, at: run.createdAt })}) is of an earlier version of the plan. Run the scenario${run.dataDate ? " or re-forecast it" : ""} again before publishing closures.`);
  }
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

/** Where a forecast's closures come from and what it does not know, for the person about to publish them. */
async function sourceOf(run: { id: string; dataDate: string | null; createdAt: Date }) {
  const missing = await countShiftsNotInRun({ runId: run.id });
  return `${forecastSourceText({ dataDate: run.dataDate, at: run.createdAt })}.${missing ? ` ${changesNotInText(missing)}: re-forecast first if they move the closures.` : ""}`;
}

/** What the public sees (the publication still standing) came from another forecast than the newest. */
const lags = (standing: { runId: string }, newestRunId: string) => standing.runId !== newestRunId;

/** `publicationLagText` when the plan's standing publication lags its newest forecast (`newestRunId`); else null. */
export function publicationLagOf(standing: { runId: string; publishedAt: Date } | undefined, newestRunId: string | null): string | null {
  return standing && newestRunId && lags(standing, newestRunId) ? publicationLagText(standing.publishedAt) : null;
}

/**
 * For each plan of record with a publication standing behind its newest forecast, that in words
 * (`publicationLagText`), by scenario id: the forecast e-mail says it under the forecast. One query.
 */
export async function publicationLagTexts(plans: ReadonlyArray<{ planScenarioId: string | null; planRunId: string | null }>): Promise<Map<string, string>> {
  const ids = plans.flatMap((p) => (p.planScenarioId ? [p.planScenarioId] : []));
  const standing = await standingPublications({ scenarioIds: ids });
  const out = new Map<string, string>();
  for (const p of plans) {
    const text = p.planScenarioId && publicationLagOf(standing.get(p.planScenarioId), p.planRunId);
    if (text) out.set(p.planScenarioId!, text);
  }
  return out;
}

/**
 * Earlier publications, newest first, each with the forecast it came from; and, when the publication still standing
 * (what every feed and advisory shows) came from an earlier forecast than the newest, the two in words — the Share
 * page says the public lags the forecast.
 */
export async function closurePublicationsOf({ scenario }: { scenario: ScenarioDetail }) {
  const [rows, newest, standing] = await Promise.all([
    listClosurePublications({ scenarioId: scenario.id }),
    getNewestForecast({ scenarioId: scenario.id, withResults: false }),
    standingPublications({ scenarioIds: [scenario.id] }).then((m) => m.get(scenario.id)),
  ]);
  return {
    publications: rows.map(({ runDataDate, runAt, ...p }) => ({ ...p, source: forecastSourceText({ dataDate: runDataDate, at: runAt }) })),
    lag:
      standing && newest && lags(standing, newest.id)
        ? { publishedAt: standing.publishedAt, published: forecastSourceText({ dataDate: standing.runDataDate, at: standing.runAt }), newest: forecastSourceText({ dataDate: newest.dataDate, at: newest.createdAt }), newestStale: newest.stale }
        : null,
  };
}

/**
 * The notice exactly as publishing would send it, for the confirmation people see first: the run it comes
 * from, the recipients, subject and text. Publishing names that run, so what was previewed is what goes out.
 */
export async function previewClosurePlan({ scenario }: { scenario: ScenarioDetail }) {
  const d = await draftPublication(scenario, PREVIEW_LINKS);
  const sample = d.mail(d.subscribers[0]?.email ?? "");
  return { runId: d.run.id, source: await sourceOf(d.run), closureCount: d.closures.length, to: d.subscribers.map((s) => s.email), subject: sample.subject, text: sample.text };
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
  if (runId !== undefined && runId !== d.run.id) throw new AppError("conflict", "The plan was run again or re-forecast after your preview. Look at the new preview before publishing.");
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
