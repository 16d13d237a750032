import "server-only";
import { getLatestPlanRunWithTrace, listLogsOfScenarios } from "@db/queries/progress";
import { parseScenario } from "@sim/validate";
import type { Scenario } from "@sim/schema";
import { formatDateTime, formatIsoDate } from "@/lib/format";
import { lastWorkDate, progressSentence, progressToDate, type FieldLogRecord } from "@/lib/progress-to-date";
import { againstPlanFor, againstPlanSentence } from "@/lib/against-plan";

type PlanLog = { scenarioId: string; version: number; entries: FieldLogRecord[] };

/** `make` for each plan of record with shifts in its field log and a plan that parses, by scenario id (one read of the logs). */
async function perPlanLog<T>(planScenarioIds: ReadonlyArray<string | null>, make: (plan: Scenario, log: PlanLog) => T | null | Promise<T | null>): Promise<Map<string, T>> {
  const ids = [...new Set(planScenarioIds.filter((id): id is string => id !== null))];
  const out = new Map<string, T>();
  for (const log of await listLogsOfScenarios({ scenarioIds: ids })) {
    if (log.entries.length === 0) continue;
    const parsed = parseScenario(log.definition);
    if (!parsed.ok) continue;
    const made = await make(parsed.scenario, log);
    if (made !== null) out.set(log.scenarioId, made);
  }
  return out;
}

/**
 * Each plan of record's progress sentence (src/lib/progress-to-date.ts `progressSentence`), by scenario id, for the
 * project list: two queries however many projects. A plan with no shift in its log, or one that no longer parses, has
 * none.
 */
export function planProgressTexts(planScenarioIds: ReadonlyArray<string | null>): Promise<Map<string, string>> {
  return perPlanLog(planScenarioIds, (plan, log) => progressSentence(plan, log.entries, formatIsoDate));
}

/**
 * The progress sentence and, beside it, the standing against the plan run (src/lib/against-plan.ts
 * `againstPlanSentence`; null without a run of the plan as it stands): for the project page and the forecast e-mail,
 * about one project at a time — it reads each plan run's trace, which the project list does without.
 */
export function planProgressAndAgainst(planScenarioIds: ReadonlyArray<string | null>): Promise<Map<string, { progress: string | null; against: string | null }>> {
  return perPlanLog(planScenarioIds, async (plan, log) => {
    const rows = progressToDate(plan, log.entries);
    const toDate = lastWorkDate(log.entries);
    const against = againstPlanFor({ rows, run: await getLatestPlanRunWithTrace({ scenarioId: log.scenarioId }), version: log.version, plan, toDate, formatDate: formatIsoDate, formatDateTime });
    return { progress: progressSentence(plan, log.entries, formatIsoDate), against: against && againstPlanSentence(rows, against.byOperation, toDate, formatIsoDate) };
  });
}
