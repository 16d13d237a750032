import "server-only";
import { getProject } from "@db/queries/projects";
import { getLatestRun } from "@db/queries/runs";
import { getScenario } from "@db/queries/scenarios";
import { getNewestReforecastHeadline } from "@db/queries/progress";
import { findLiveShareLink } from "@db/queries/shares";
import type { ShareScope } from "@db/schema";
import { getSearch, listVariants } from "@db/queries/searches";
import { parseScenario } from "@sim/validate";
import { AppError } from "./errors";
import { hashShareToken } from "./share-token";
import { publicSearchView } from "./searches";
import type { SharedSearchAnswer } from "@/lib/search-contract";

const GONE = "This link does not exist, has expired or was revoked.";

/**
 * What each public route accepts: the scenario page and JSON only a "scenario" link; the calendar feed either
 * of those two kinds (a scenario link already shows everything the feed holds); a plan search only a "search"
 * link, and only the search it names. A feed token e-mailed to subscribers thus opens the feed and nothing
 * else, a search link opens no scenario, and a scenario link opens none of its searches.
 */
const SCENARIO_VIEW: readonly ShareScope[] = ["scenario"];
const CLOSURE_FEED: readonly ShareScope[] = ["closure-feed", "scenario"];
const SEARCH_VIEW: readonly ShareScope[] = ["search"];

async function liveLink(token: string, scopes: readonly ShareScope[]) {
  const link = token.length >= 20 && token.length <= 100 ? await findLiveShareLink({ tokenHash: hashShareToken(token), scopes }) : null;
  if (!link) throw new AppError("not_found", GONE);
  return link;
}

/** The scenario behind a live link that may open the closure calendar feed. */
export async function sharedClosureFeedScenario(token: string) {
  const scenario = await getScenario({ id: (await liveLink(token, CLOSURE_FEED)).scenarioId });
  if (!scenario) throw new AppError("not_found", GONE);
  return scenario;
}

export async function loadSharedScenario(token: string) {
  const link = await liveLink(token, SCENARIO_VIEW);
  const scenario = await getScenario({ id: link.scenarioId });
  if (!scenario) throw new AppError("not_found", GONE);
  // Publish the parsed definition: only fields of the format leave through a link, whatever a row holds.
  const parsed = parseScenario(scenario.definition);
  const definition = parsed.ok ? parsed.scenario : scenario.definition;
  // The newest re-forecast too: once the field log has moved the plan run on, the link's reader is told (as the
  // Outlook and the owner brief tell their readers), not left quoting the plan run's P80.
  const [project, run, reforecast] = await Promise.all([getProject({ id: scenario.projectId }), getLatestRun({ scenarioId: scenario.id }), getNewestReforecastHeadline({ scenarioId: scenario.id })]);
  return {
    link: { label: link.label, expiresAt: link.expiresAt },
    project: project && { name: project.name, structureName: project.structureName, region: project.region },
    scenario: { name: scenario.name, description: scenario.description, version: scenario.version, updatedAt: scenario.updatedAt, updatedByName: scenario.updatedByName, definition },
    run,
    reforecast,
  };
}

/**
 * The plan search behind a live search link, read-only: its frontier and table of plans, the project and the
 * scenario's name and target — nothing to save, cancel or follow to another search.
 */
export async function loadSharedSearch(token: string): Promise<SharedSearchAnswer> {
  const link = await liveLink(token, SEARCH_VIEW);
  const search = link.searchId ? await getSearch({ id: link.searchId }) : null;
  // The link's scenario is the search's by construction; checked anyway so a row can never open another's search.
  if (!search || search.scenarioId !== link.scenarioId) throw new AppError("not_found", GONE);
  const [scenario, project, variants] = await Promise.all([getScenario({ id: search.scenarioId }), getProject({ id: search.projectId }), listVariants({ searchId: search.id })]);
  if (!scenario) throw new AppError("not_found", GONE);
  const target = (scenario.definition as { targetDate?: unknown }).targetDate;
  return {
    link: { label: link.label, expiresAt: link.expiresAt.toISOString() },
    project: project && { name: project.name, structureName: project.structureName, region: project.region },
    scenario: { name: scenario.name, targetDate: typeof target === "string" ? target : null },
    ...publicSearchView(search, variants),
  };
}
