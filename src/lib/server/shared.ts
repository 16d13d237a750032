import "server-only";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import { getScenario } from "@db/queries/scenarios";
import { findLiveShareLink } from "@db/queries/shares";
import { AppError } from "./errors";
import { hashShareToken } from "./share-token";

export async function loadSharedScenario(token: string) {
  const link = token.length >= 20 && token.length <= 100 ? await findLiveShareLink({ tokenHash: hashShareToken(token) }) : null;
  if (!link) throw new AppError("not_found", "This link does not exist, has expired or was revoked.");
  const scenario = await getScenario({ id: link.scenarioId });
  if (!scenario) throw new AppError("not_found", "This link does not exist, has expired or was revoked.");
  const [project, run] = await Promise.all([getProject({ id: scenario.projectId }), getLatestRun({ scenarioId: scenario.id })]);
  return {
    link: { label: link.label, expiresAt: link.expiresAt },
    project: project && { name: project.name, structureName: project.structureName, region: project.region },
    scenario: { name: scenario.name, description: scenario.description, version: scenario.version, updatedAt: scenario.updatedAt, updatedByName: scenario.updatedByName, definition: scenario.definition },
    run,
  };
}
