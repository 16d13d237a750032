import "server-only";
import type { RunSummary } from "@sim/index";
import { getProject } from "@db/queries/projects";
import { getLatestRun, getNewestForecast } from "@db/queries/runs";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { plannedClosures } from "@/lib/exports/closures";
import { closuresToIcs } from "@/lib/exports/ical";
import { AppError } from "./errors";
import { validateDefinition } from "./scenario-input";

function summaryOf(run: { results: unknown } | null): RunSummary {
  if (!run) throw new AppError("not_found", "This scenario has not been run yet; run it first.");
  return run.results as unknown as RunSummary;
}

export async function latestSummaryOf(scenario: ScenarioDetail): Promise<RunSummary> {
  return summaryOf(await getLatestRun({ scenarioId: scenario.id }));
}

/** The run's closure timeline as closures, or 409 for a run stored before the engine kept one. */
export function closuresOfRun(summary: RunSummary) {
  const closures = plannedClosures(summary);
  if (!closures) throw new AppError("conflict", "This run was stored before closures were recorded hour by hour. Run the scenario again.");
  return closures;
}

/**
 * Which run a scenario's closure calendar is of: `plan-run` — its latest plan run, the run the Outlook draws; `forecast`
 * — its forecast by the forecast rule (db/queries/runs.ts `forecastOrder`: the newest re-forecast from the field log
 * once there is one), whose closures on a job under way are the ones still ahead.
 */
export const CALENDAR_RUNS = ["plan-run", "forecast"] as const;
export type CalendarRun = (typeof CALENDAR_RUNS)[number];

export async function closuresCalendar(scenario: ScenarioDetail, of: CalendarRun = "plan-run"): Promise<string> {
  const definition = validateDefinition(scenario.definition);
  const summary = summaryOf(of === "forecast" ? await getNewestForecast({ scenarioId: scenario.id }) : await getLatestRun({ scenarioId: scenario.id }));
  const project = await getProject({ id: scenario.projectId });
  return closuresToIcs({
    closures: closuresOfRun(summary),
    // The closure hours count from the run's own start date: a plan whose start moved after the run keeps its dates.
    startDate: summary.startDate,
    timeZone: definition.timeZone,
    structure: project?.structureName ?? definition.name,
    scenario: scenario.name,
    uidSeed: scenario.id,
  });
}

export function fileName(name: string, ext: string) {
  return `${name.replace(/[^A-Za-z0-9]+/g, "-").replace(/^-|-$/g, "").toLowerCase() || "scenario"}.${ext}`;
}
