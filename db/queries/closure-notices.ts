import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "../client";
import { closurePublications, closureSubscribers, scenarios, shareLinks, simulationRuns, users } from "../schema";
import type { Executor } from "./mail";
import { newestPublicationFirst, publicationStands } from "./published-plans";

export async function listClosureSubscribers({ projectId }: { projectId: string }) {
  return getDb()
    .select({ id: closureSubscribers.id, email: closureSubscribers.email, label: closureSubscribers.label, createdAt: closureSubscribers.createdAt })
    .from(closureSubscribers)
    .where(eq(closureSubscribers.projectId, projectId))
    .orderBy(asc(closureSubscribers.email));
}

/** Adding someone already on the list changes nothing and is not an error. */
export async function addClosureSubscriber(input: { projectId: string; email: string; label: string; userId: string }) {
  await getDb()
    .insert(closureSubscribers)
    .values({ projectId: input.projectId, email: input.email.trim().toLowerCase(), label: input.label, addedById: input.userId })
    .onConflictDoNothing();
}

export async function removeClosureSubscriber({ projectId, id }: { projectId: string; id: string }) {
  const rows = await getDb()
    .delete(closureSubscribers)
    .where(and(eq(closureSubscribers.projectId, projectId), eq(closureSubscribers.id, id)))
    .returning({ id: closureSubscribers.id });
  return rows.length > 0;
}

export async function insertClosurePublication(input: { tx: Executor; scenarioId: string; runId: string; shareLinkId: string; closureCount: number; notified: number; userId: string }) {
  const [row] = await input.tx
    .insert(closurePublications)
    .values({ scenarioId: input.scenarioId, runId: input.runId, shareLinkId: input.shareLinkId, closureCount: input.closureCount, notified: input.notified, publishedById: input.userId })
    .returning({ id: closurePublications.id, publishedAt: closurePublications.publishedAt });
  return row;
}

export async function listClosurePublications({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({
      id: closurePublications.id,
      closureCount: closurePublications.closureCount,
      notified: closurePublications.notified,
      publishedAt: closurePublications.publishedAt,
      publishedByName: users.name,
      // The forecast it was published from, and whether its links still stand (a revoked one is withdrawn).
      runId: closurePublications.runId,
      runDataDate: simulationRuns.dataDate,
      runAt: simulationRuns.createdAt,
      withdrawn: sql<boolean>`(${shareLinks.revokedAt} is not null)`,
    })
    .from(closurePublications)
    .innerJoin(users, eq(users.id, closurePublications.publishedById))
    .innerJoin(simulationRuns, eq(simulationRuns.id, closurePublications.runId))
    .innerJoin(shareLinks, eq(shareLinks.id, closurePublications.shareLinkId))
    .where(eq(closurePublications.scenarioId, scenarioId))
    .orderBy(...newestPublicationFirst)
    .limit(10);
}

/**
 * Each scenario's publication still standing (published-plans.ts `publicationStands`, newest first): what every
 * calendar feed and travel advisory of the scenario shows. Scenarios never published are absent.
 */
export async function standingPublications({ scenarioIds }: { scenarioIds: string[] }) {
  type Standing = { runId: string; publishedAt: Date; runDataDate: string | null; runAt: Date };
  if (scenarioIds.length === 0) return new Map<string, Standing>();
  const rows = await getDb()
    .selectDistinctOn([closurePublications.scenarioId], {
      scenarioId: closurePublications.scenarioId,
      runId: closurePublications.runId,
      publishedAt: closurePublications.publishedAt,
      runDataDate: simulationRuns.dataDate,
      runAt: simulationRuns.createdAt,
    })
    .from(closurePublications)
    .innerJoin(shareLinks, eq(shareLinks.id, closurePublications.shareLinkId))
    .innerJoin(simulationRuns, eq(simulationRuns.id, closurePublications.runId))
    .where(and(inArray(closurePublications.scenarioId, scenarioIds), publicationStands))
    .orderBy(closurePublications.scenarioId, ...newestPublicationFirst);
  return new Map<string, Standing>(rows.map(({ scenarioId, ...r }) => [scenarioId, r]));
}

/**
 * Each run's closure timeline (its representative iteration's, the closures a publication of it tells the public)
 * and its scenario's time zone, by run id: only that part of the stored results is read. A run stored before the
 * timeline was recorded has `timeline: null`.
 */
export async function closureTimelinesOf({ runIds }: { runIds: string[] }) {
  type Timeline = { timeline: unknown[] | null; timeZone: string | null };
  if (runIds.length === 0) return new Map<string, Timeline>();
  const rows = await getDb()
    .select({
      id: simulationRuns.id,
      timeline: sql<unknown[] | null>`(case when jsonb_typeof(${simulationRuns.results}->'representative'->'closureTimeline') = 'array' then ${simulationRuns.results}->'representative'->'closureTimeline' end)`,
      timeZone: sql<string | null>`${scenarios.definition}->>'timeZone'`,
    })
    .from(simulationRuns)
    .innerJoin(scenarios, eq(scenarios.id, simulationRuns.scenarioId))
    .where(inArray(simulationRuns.id, [...new Set(runIds)]));
  return new Map<string, Timeline>(rows.map(({ id, ...r }) => [id, r]));
}
