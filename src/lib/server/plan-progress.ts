import "server-only";
import { getPlanRunTrace, listLogsOfScenarios } from "@db/queries/progress";
import { parseScenario } from "@sim/validate";
import { formatDateTime, formatIsoDate } from "@/lib/format";
import { lastWorkDate, progressSentence, progressToDate } from "@/lib/progress-to-date";
import { againstPlanFor, againstPlanSentence } from "@/lib/against-plan";

/**
 * Each plan of record's progress sentence (src/lib/progress-to-date.ts `progressSentence`), by scenario id, for the
 * pages that head a project with its plan: two queries however many projects. A plan with no shift in its log,
 * or one that no longer parses, has none.
 */
export async function planProgressTexts(planScenarioIds: ReadonlyArray<string | null>): Promise<Map<string, string>> {
  const ids = [...new Set(planScenarioIds.filter((id): id is string => id !== null))];
  const out = new Map<string, string>();
  for (const log of await listLogsOfScenarios({ scenarioIds: ids })) {
    if (log.entries.length === 0) continue;
    const parsed = parseScenario(log.definition);
    if (!parsed.ok) continue;
    const text = progressSentence(parsed.scenario, log.entries, formatIsoDate);
    if (text) out.set(log.scenarioId, text);
  }
  return out;
}

/**
 * Each plan of record's standing against its plan run (src/lib/against-plan.ts `againstPlanSentence`), by scenario
 * id: for the pages and e-mails about one project at a time — it reads each plan run's trace, which the project list
 * does not. None for a plan with no shift in its log, or no run of the plan as it stands.
 */
export async function planAgainstTexts(planScenarioIds: ReadonlyArray<string | null>): Promise<Map<string, string>> {
  const ids = [...new Set(planScenarioIds.filter((id): id is string => id !== null))];
  const out = new Map<string, string>();
  for (const log of await listLogsOfScenarios({ scenarioIds: ids })) {
    if (log.entries.length === 0) continue;
    const parsed = parseScenario(log.definition);
    if (!parsed.ok) continue;
    const plan = parsed.scenario;
    const rows = progressToDate(plan, log.entries);
    const toDate = lastWorkDate(log.entries);
    const against = againstPlanFor({ rows, run: await getPlanRunTrace({ scenarioId: log.scenarioId }), version: log.version, plan, toDate, formatDate: formatIsoDate, formatDateTime });
    const text = against && againstPlanSentence(rows, against.byOperation, toDate, formatIsoDate);
    if (text) out.set(log.scenarioId, text);
  }
  return out;
}
