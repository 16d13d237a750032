import "server-only";
import { listLatestPlanRunsWithTrace, listLogsOfScenarios } from "@db/queries/progress";
import { parseScenario } from "@sim/validate";
import type { Scenario } from "@sim/schema";
import { formatDateTime, formatIsoDate } from "@/lib/format";
import { lastWorkDate, progressSentence, progressToDate, type FieldLogRecord } from "@/lib/progress-to-date";
import { againstPlanFor, againstPlanSentence } from "@/lib/against-plan";
import { eachItemOnItsOwn } from "./background-pass";

type PlanLog = { scenarioId: string; definition: unknown; entries: FieldLogRecord[] };

/**
 * `make` for each log with shifts and a plan that parses, by scenario id. A plan whose sentence throws has none and
 * is logged (src/lib/server/background-pass.ts `eachItemOnItsOwn`: its id and the error's class, once while it keeps
 * failing): one odd plan must not take the project list, or every project's forecast e-mail, down with it.
 */
export async function eachPlanLog<T>(logs: ReadonlyArray<PlanLog>, make: (plan: Scenario, log: PlanLog) => T | null): Promise<Map<string, T>> {
  const out = new Map<string, T>();
  await eachItemOnItsOwn("progress sentence", logs, (log) => log.scenarioId, async (log) => {
    if (log.entries.length === 0) return;
    const parsed = parseScenario(log.definition);
    if (!parsed.ok) return;
    const made = make(parsed.scenario, log);
    if (made !== null) out.set(log.scenarioId, made);
  });
  return out;
}

/**
 * Each plan of record's progress sentence (src/lib/progress-to-date.ts `progressSentence`) and, beside it, the
 * standing against its plan run (src/lib/against-plan.ts `againstPlanSentence`; null without a run of the plan as it
 * stands), by scenario id: for the project list, the project page and the forecast e-mail. Three queries however many
 * projects (the logs, the plans, each plan's newest plan run with its median iteration). A plan with no shift in its
 * log, or one that no longer parses, has neither.
 */
export async function planProgressAndAgainst(planScenarioIds: ReadonlyArray<string | null>): Promise<Map<string, { progress: string | null; against: string | null }>> {
  const ids = [...new Set(planScenarioIds.filter((id): id is string => id !== null))];
  const [logs, runs] = await Promise.all([listLogsOfScenarios({ scenarioIds: ids }), listLatestPlanRunsWithTrace({ scenarioIds: ids })]);
  return eachPlanLog(logs, (plan, log) => {
    const rows = progressToDate(plan, log.entries);
    const toDate = lastWorkDate(log.entries);
    const against = againstPlanFor({ rows, run: runs.get(log.scenarioId) ?? null, plan, toDate, formatDate: formatIsoDate, formatDateTime });
    return { progress: progressSentence(plan, log.entries, formatIsoDate), against: against && againstPlanSentence(rows, against.byOperation, toDate, formatIsoDate) };
  });
}
