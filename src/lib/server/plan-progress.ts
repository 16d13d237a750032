import "server-only";
import { listLogsOfScenarios } from "@db/queries/progress";
import { parseScenario } from "@sim/validate";
import { formatIsoDate } from "@/lib/format";
import { progressSentence } from "@/lib/progress-to-date";

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
