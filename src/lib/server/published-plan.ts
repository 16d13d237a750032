import "server-only";
import { findPublishedPlan } from "@db/queries/published-plans";
import type { RunSummary, Scenario } from "@sim/index";
import { parseScenario } from "@sim/validate";
import { closuresToIcs } from "@/lib/exports/ical";
import { AppError } from "./errors";
import { closuresCalendar, closuresOfRun } from "./exports";
import { hashShareToken } from "./share-token";
import { sharedScenarioDetail } from "./shared";

const GONE = "This link does not exist, has expired or was revoked.";

export interface PublishedPlan {
  structure: string;
  region: string;
  scenarioName: string;
  publishedAt: Date;
  definition: Scenario;
  summary: RunSummary;
}

/** The published closure plan behind a publication's token, or null (unknown, revoked, expired, or not a publication). */
export async function publishedPlanOf(token: string): Promise<PublishedPlan | null> {
  if (token.length < 20 || token.length > 100) return null;
  const row = await findPublishedPlan({ tokenHash: hashShareToken(token) });
  if (!row) return null;
  const parsed = parseScenario(row.definition);
  if (!parsed.ok) return null;
  return { structure: row.structureName, region: row.region, scenarioName: row.scenarioName, publishedAt: row.publishedAt, definition: parsed.scenario, summary: row.results as unknown as RunSummary };
}

export async function requirePublishedPlan(token: string): Promise<PublishedPlan> {
  const plan = await publishedPlanOf(token);
  if (!plan) throw new AppError("not_found", GONE);
  return plan;
}

/**
 * The calendar feed behind a token: a publication's feed shows the run that was published (so it matches the
 * notice and the advisory hour by hour); an ordinary scenario share link shows the latest run, as before.
 */
export async function sharedClosureCalendar(token: string): Promise<{ name: string; ics: string }> {
  const plan = await publishedPlanOf(token);
  if (plan) {
    const ics = closuresToIcs({ closures: closuresOfRun(plan.summary), startDate: plan.definition.startDate, timeZone: plan.definition.timeZone, structure: plan.structure, scenario: plan.scenarioName, uidSeed: plan.summary.seed });
    return { name: plan.scenarioName, ics };
  }
  const scenario = await sharedScenarioDetail(token);
  return { name: scenario.name, ics: await closuresCalendar(scenario) };
}
