import "server-only";
import { findPublishedPlan } from "@db/queries/published-plans";
import type { RunSummary, Scenario } from "@sim/index";
import { parseScenario } from "@sim/validate";
import { closuresToIcs } from "@/lib/exports/ical";
import { AppError } from "./errors";
import { closuresCalendar, closuresOfRun } from "./exports";
import { hashShareToken } from "./share-token";
import { hourlyQueues, type HourlyQueues } from "@sim/hourly-queue";
import { sharedClosureFeedScenario } from "./shared";

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
export async function sharedClosureCalendar(token: string, baseUrl: string): Promise<{ name: string; ics: string }> {
  const plan = await publishedPlanOf(token);
  if (plan) {
    const s = plan.definition;
    const queues = hourlyQueues(s, plan.summary.representative.closureTimeline);
    const ics = closuresToIcs({
      closures: closuresOfRun(plan.summary),
      startDate: s.startDate,
      timeZone: s.timeZone,
      structure: plan.structure,
      scenario: plan.scenarioName,
      uidSeed: plan.summary.seed,
      advisoryUrl: `${baseUrl}/advisory/${token}`,
      note: queues ? (c) => backupNote(longestWhile(queues, c.start, c.end)) : undefined,
    });
    return { name: plan.scenarioName, ics };
  }
  const scenario = await sharedClosureFeedScenario(token);
  return { name: scenario.name, ics: await closuresCalendar(scenario) };
}

/** The longest hourly queue (miles) over the clock hours a closure stands in, [start, end) in hours since startDate. */
function longestWhile(q: HourlyQueues, start: number, end: number): number {
  let best = 0;
  for (let t = Math.floor(start); t < end; t++) {
    const row = q.miles[Math.floor(t / 24) - q.firstDay];
    if (row) best = Math.max(best, row[t % 24]);
  }
  return best;
}

function backupNote(miles: number): string {
  return miles >= 0.1 ? `Expected longest backup: ${miles.toFixed(1)} mi.` : "No significant backup expected.";
}
