import "server-only";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import { getScenario } from "@db/queries/scenarios";
import { findLiveShareLink } from "@db/queries/shares";
import { parseScenario } from "@sim/validate";
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
  const scenario = await getScenario({ id: link.scenarioId });
  if (!scenario) throw new AppError("not_found", GONE);
  // Publish the parsed definition: only fields of the format leave through a link, whatever a row holds.
  const parsed = parseScenario(scenario.definition);
  const definition = parsed.ok ? parsed.scenario : scenario.definition;
  const [project, run] = await Promise.all([getProject({ id: scenario.projectId }), getLatestRun({ scenarioId: scenario.id })]);
  return {
    link: { label: link.label, expiresAt: link.expiresAt },
    project: project && { name: project.name, structureName: project.structureName, region: project.region },
    scenario: { name: scenario.name, description: scenario.description, version: scenario.version, updatedAt: scenario.updatedAt, updatedByName: scenario.updatedByName, definition },
    run,
  };
}
