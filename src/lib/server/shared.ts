import "server-only";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import { getScenario } from "@db/queries/scenarios";
import { isPublicationLink } from "@db/queries/published-plans";
import { findLiveShareLink } from "@db/queries/shares";
import { AppError } from "./errors";
import { hashShareToken } from "./share-token";

const GONE = "This link does not exist, has expired or was revoked.";

async function liveLink(token: string) {
  const link = token.length >= 20 && token.length <= 100 ? await findLiveShareLink({ tokenHash: hashShareToken(token) }) : null;
  if (!link) throw new AppError("not_found", GONE);
  return link;
}

/** The scenario behind a live share link (for server-side exports such as the closure calendar feed). */
export async function sharedScenarioDetail(token: string) {
  const scenario = await getScenario({ id: (await liveLink(token)).scenarioId });
  if (!scenario) throw new AppError("not_found", GONE);
  return scenario;
}

export async function loadSharedScenario(token: string) {
  const link = await liveLink(token);
  // A closure publication's token opens its calendar feed and travel advisory only, never the plan itself.
  if (await isPublicationLink({ shareLinkId: link.id })) throw new AppError("not_found", GONE);
  const scenario = await getScenario({ id: link.scenarioId });
  if (!scenario) throw new AppError("not_found", GONE);
  const [project, run] = await Promise.all([getProject({ id: scenario.projectId }), getLatestRun({ scenarioId: scenario.id })]);
  return {
    link: { label: link.label, expiresAt: link.expiresAt },
    project: project && { name: project.name, structureName: project.structureName, region: project.region },
    scenario: { name: scenario.name, description: scenario.description, version: scenario.version, updatedAt: scenario.updatedAt, updatedByName: scenario.updatedByName, definition: scenario.definition },
    run,
  };
}
