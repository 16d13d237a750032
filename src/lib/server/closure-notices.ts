import "server-only";
import { getDb } from "@db/client";
import { closureTimelinesOf, insertClosurePublication, listClosurePublications, listClosureSubscribers, standingPublications } from "@db/queries/closure-notices";
import { getProject } from "@db/queries/projects";
import { getNewestForecast } from "@db/queries/runs";
import { countShiftsNotInRun } from "@db/queries/progress";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { createShareLink } from "@db/queries/shares";
import type { RunSummary } from "@sim/index";
import { closureChanges, closureChangesText, closureTimeline } from "@/lib/closure-changes";
import { closureLocalTimes, hoursSince } from "@/lib/exports/closures";
import { displayTimeZone } from "@/lib/format";
import { todayIn } from "@/lib/progress-schema";
import { changesNotInText, forecastSourceText, publicationLagText } from "@/lib/plan-of-record-text";
import type { ClosureNoticePreview, ClosurePublicationsAnswer, ClosurePublishedAnswer } from "@/lib/closure-notice-contract";
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
 * The forecast is the newest re-forecast from the field log once there is one, else the latest plan run
 * (`getNewestForecast`, by the forecast rule of db/queries/runs.ts `forecastOrder`): on a
 * job under way the public hears the closures the field log has moved, not the plan's first guess. Refused, like
 * publishing, when there is no forecast or it is of an earlier version of the plan.
 */
async function draftPublication(scenario: ScenarioDetail, links: { feedUrl: string; advisoryUrl: string }) {
  const run = await getNewestForecast({ scenarioId: scenario.id });
  if (!run) throw new AppError("conflict", "Run the scenario before publishing its closures.");
  if (run.stale) {
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

/**
 * Whether what the public sees (each scenario's publication still standing, `standing.runId`) lags its newest
 * forecast (`newestRunId`), by scenario id — absent when it does not. It lags when the newest forecast's closures
 * from today on (in the scenario's time zone) differ from the published ones (`changes`, said in words); a newer
 * forecast that moves none does not lag. A run stored before closure timelines were kept cannot be compared: then a
 * newer forecast lags, `changes` null. One query for all the runs' timelines.
 */
async function lagsOf(pairs: ReadonlyArray<{ scenarioId: string; standingRunId: string; newestRunId: string }>): Promise<Map<string, { changes: string | null }>> {
  const differing = pairs.filter((p) => p.standingRunId !== p.newestRunId);
  const timelines = await closureTimelinesOf({ runIds: differing.flatMap((p) => [p.standingRunId, p.newestRunId]) });
  const out = new Map<string, { changes: string | null }>();
  for (const p of differing) {
    const was = timelines.get(p.standingRunId);
    const now = timelines.get(p.newestRunId);
    const published = closureTimeline(was?.timeline);
    const newest = closureTimeline(now?.timeline);
    if (!published || !newest) {
      out.set(p.scenarioId, { changes: null });
      continue;
    }
    const changes = closureChanges(published, newest, todayIn(now?.timeZone ?? displayTimeZone()));
    if (changes) out.set(p.scenarioId, { changes: closureChangesText(changes) });
  }
  return out;
}

/**
 * For each plan of record whose standing publication lags its newest forecast (`lagsOf`), that in words
 * (`publicationLagText`), by scenario id: the project page and the forecast e-mail say it under the forecast.
 */
export async function publicationLagTexts(plans: ReadonlyArray<{ planScenarioId: string | null; planRunId: string | null }>): Promise<Map<string, string>> {
  const ids = plans.flatMap((p) => (p.planScenarioId ? [p.planScenarioId] : []));
  const standing = await standingPublications({ scenarioIds: ids });
  const pairs = plans.flatMap((p) => {
    const s = p.planScenarioId ? standing.get(p.planScenarioId) : undefined;
    return s && p.planRunId ? [{ scenarioId: p.planScenarioId!, standingRunId: s.runId, newestRunId: p.planRunId }] : [];
  });
  const lags = await lagsOf(pairs);
  return new Map([...lags].map(([scenarioId, lag]) => [scenarioId, publicationLagText(standing.get(scenarioId)!.publishedAt, lag.changes)]));
}

/**
 * Earlier publications, newest first, each with the forecast it came from; and, when the publication still standing
 * (what every feed and advisory shows) lags the newest forecast (`lagsOf`), the two forecasts and what changed in
 * words — the Share page says the public lags the forecast.
 */
export async function closurePublicationsOf({ scenario }: { scenario: ScenarioDetail }): Promise<ClosurePublicationsAnswer> {
  const [rows, newest, standing] = await Promise.all([
    listClosurePublications({ scenarioId: scenario.id }),
    getNewestForecast({ scenarioId: scenario.id, withResults: false }),
    standingPublications({ scenarioIds: [scenario.id] }).then((m) => m.get(scenario.id)),
  ]);
  const lag = standing && newest ? (await lagsOf([{ scenarioId: scenario.id, standingRunId: standing.runId, newestRunId: newest.id }])).get(scenario.id) : undefined;
  return {
    publications: rows.map(({ runDataDate, runAt, ...p }) => ({ ...p, publishedAt: p.publishedAt.toISOString(), source: forecastSourceText({ dataDate: runDataDate, at: runAt }) })),
    lag:
      standing && newest && lag
        ? { publishedAt: standing.publishedAt.toISOString(), published: forecastSourceText({ dataDate: standing.runDataDate, at: standing.runAt }), newest: forecastSourceText({ dataDate: newest.dataDate, at: newest.createdAt }), newestStale: newest.stale, changes: lag.changes }
        : null,
  };
}

/**
 * The notice exactly as publishing would send it, for the confirmation people see first: the run it comes
 * from, the recipients, subject and text. Publishing names that run, so what was previewed is what goes out.
 */
export async function previewClosurePlan({ scenario }: { scenario: ScenarioDetail }): Promise<ClosureNoticePreview> {
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
export async function publishClosurePlan({ scenario, userId, baseUrl, runId }: { scenario: ScenarioDetail; userId: string; baseUrl: string; runId?: string }): Promise<ClosurePublishedAnswer> {
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
    return { id: publication.id, publishedAt: publication.publishedAt.toISOString(), closureCount: d.closures.length, notified: d.subscribers.length, ...links };
  });
}
