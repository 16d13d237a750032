import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { closurePublications, projects, scenarioRevisions, scenarios, shareLinks, simulationRuns } from "../schema";

/**
 * The closure plan a publication's token stands for: the published run, the scenario version it was computed
 * from and the structure's name. Only a live link (not revoked, not expired) that was created by a closure
 * publication answers, so an ordinary scenario share link opens no advisory, and the advisory opens nothing but
 * its own published run. Null when there is no such plan.
 */
export async function findPublishedPlan({ tokenHash }: { tokenHash: string }) {
  const [row] = await getDb()
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
      expiresAt: shareLinks.expiresAt,
    })
    .from(shareLinks)
    .innerJoin(closurePublications, eq(closurePublications.shareLinkId, shareLinks.id))
    .innerJoin(simulationRuns, eq(simulationRuns.id, closurePublications.runId))
    .innerJoin(scenarios, eq(scenarios.id, shareLinks.scenarioId))
    .innerJoin(projects, eq(projects.id, scenarios.projectId))
    .innerJoin(scenarioRevisions, and(eq(scenarioRevisions.scenarioId, simulationRuns.scenarioId), eq(scenarioRevisions.version, simulationRuns.scenarioVersion)))
    .where(and(eq(shareLinks.tokenHash, tokenHash), eq(shareLinks.scope, "closure-feed"), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, new Date())))
    .orderBy(desc(closurePublications.publishedAt), desc(closurePublications.id))
    .limit(1);
  return row ?? null;
}
