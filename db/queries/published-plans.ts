import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { closurePublications, projects, scenarioRevisions, scenarios, shareLinks, simulationRuns } from "../schema";

/**
 * A closure publication stands while its link is not revoked (revoking it withdraws the publication); of a scenario's
 * standing publications the newest is what every one of its calendar feeds and travel advisories shows. One rule for
 * the token's reads below, the Share page and the project page (closure-notices.ts) and the weekly e-mail.
 */
export const publicationStands = isNull(shareLinks.revokedAt);
export const newestPublicationFirst = [desc(closurePublications.publishedAt), desc(closurePublications.id)] as const;

/**
 * The closure plan a publication's token stands for: the scenario's newest publication — so a calendar subscribed
 * to from an earlier notice, and its travel advisory, follow each new publication, as the notice promises — with
 * its run, the scenario version that run was computed from and the structure's name. Only a live link (not
 * revoked, not expired) that was created by a closure publication answers, so an ordinary scenario share link
 * opens no advisory. A publication whose own link was revoked is withdrawn: the others fall back to the newest
 * publication still standing. Null when there is no such plan.
 */
export async function findPublishedPlan({ tokenHash }: { tokenHash: string }) {
  const db = getDb();
  const [link] = await db
    .select({ scenarioId: closurePublications.scenarioId })
    .from(shareLinks)
    .innerJoin(closurePublications, eq(closurePublications.shareLinkId, shareLinks.id))
    .where(and(eq(shareLinks.tokenHash, tokenHash), eq(shareLinks.scope, "closure-feed"), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, new Date())))
    .limit(1);
  if (!link) return null;
  const [row] = await publishedPlans()
    .where(and(eq(closurePublications.scenarioId, link.scenarioId), publicationStands))
    .orderBy(...newestPublicationFirst)
    .limit(1);
  return row ?? null;
}

/** One publication as findPublishedPlan answers it, by id (the weekly closure e-mail's, which found it by project). */
export async function getPublishedPlan({ publicationId }: { publicationId: string }) {
  const [row] = await publishedPlans().where(eq(closurePublications.id, publicationId));
  return row ?? null;
}

/** Publications with their run, the scenario revision that run was computed from, and the project's names. */
function publishedPlans() {
  return getDb()
    .select({
      publicationId: closurePublications.id,
      publishedAt: closurePublications.publishedAt,
      scenarioId: scenarios.id,
      scenarioName: scenarios.name,
      projectName: projects.name,
      structureName: projects.structureName,
      region: projects.region,
      runId: simulationRuns.id,
      results: simulationRuns.results,
      definition: scenarioRevisions.definition,
    })
    .from(closurePublications)
    .innerJoin(shareLinks, eq(shareLinks.id, closurePublications.shareLinkId))
    .innerJoin(simulationRuns, eq(simulationRuns.id, closurePublications.runId))
    .innerJoin(scenarios, eq(scenarios.id, closurePublications.scenarioId))
    .innerJoin(projects, eq(projects.id, scenarios.projectId))
    .innerJoin(scenarioRevisions, and(eq(scenarioRevisions.scenarioId, simulationRuns.scenarioId), eq(scenarioRevisions.version, simulationRuns.scenarioVersion)));
}
