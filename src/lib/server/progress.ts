import "server-only";
/**
 * Field progress on the server: entry validation against the plan and the other entries (field paths from
 * `@/lib/progress-schema`), and queuing re-forecasts from the as-built state at a data date.
 */
import type { ProgressRecord } from "@sim/index";
import { formatDayNumber, parseIsoDate } from "@sim/dates";
import { HORIZON_DAYS } from "@sim/calendar";
import { budgetProblem } from "@sim/budget";
import { z } from "zod";
import { getProgressEntry, listProgress, type ProgressFields, type ProgressRow } from "@db/queries/progress";
import { getCachedForecast } from "@db/queries/forecast";
import type { ScenarioDetail } from "@db/queries/scenarios";
import { checkDependents, checkProgressEntry, todayIn, type ProgressEntry, type reforecastSchema, type RuleEntry } from "@/lib/progress-schema";
import { reforecastInputsHash } from "@/lib/run-record";
import { queueRunJob } from "./jobs";
import { AppError, badRequest } from "./errors";
import { requireScenario } from "./access";
import type { Action } from "@/lib/permissions";
import { validateDefinition } from "./scenario-input";
import { forecastForReforecast } from "./forecast/reforecast-input";

export const toRule = (r: ProgressRow): RuleEntry => ({ id: r.id, workDate: r.workDate, shift: r.shift, operationId: r.operationId, fromStationFt: r.fromStationFt, toStationFt: r.toStationFt });
export const toRecord = (r: ProgressRow): ProgressRecord => ({ workDate: r.workDate, shift: r.shift, operationId: r.operationId, fromStationFt: r.fromStationFt, toStationFt: r.toStationFt, discovered: r.discovered });

export function fieldsOf(e: ProgressEntry): ProgressFields {
  return { ...e, tempF: e.tempF ?? null };
}

/**
 * A field-log entry and the scenario it belongs to, with the caller's right to `action` (404 hides other
 * projects' entries). `deleted`: one taken out of the log (to put it back), with its own not-found words.
 */
export async function requireProgressEntry(entryId: string, action: Action, { deleted = false }: { deleted?: boolean } = {}) {
  const entry = z.uuid().safeParse(entryId).success ? await getProgressEntry({ id: entryId, deleted }) : null;
  if (!entry || !entry.scenarioId) throw new AppError("not_found", deleted ? "No deleted shift to put back." : "No such progress entry.");
  const access = await requireScenario(entry.scenarioId, action);
  return { entry, ...access };
}

/** Throws 400 with every field problem of a new or edited entry; returns the parsed plan. */
export async function validateEntry({ scenario, entry, id, now = new Date() }: { scenario: ScenarioDetail; entry: ProgressEntry; id?: string; now?: Date }) {
  const plan = validateDefinition(scenario.definition);
  const rows = await listProgress({ scenarioId: scenario.id });
  const others = rows.map(toRule);
  const problems = checkProgressEntry({ scenario: plan, entry, others, today: todayIn(plan.timeZone, now), id });
  if (problems.length === 0 && id) {
    const after = others.map((o) => (o.id === id ? { ...entry, id } : o));
    problems.push(...checkDependents(plan, others, after));
  }
  if (problems.length) throw badRequest(problems, "The entry has problems; nothing was saved.");
  return plan;
}

/** A delete may not leave a later operation's entry ahead of its predecessor. */
export async function validateDelete({ scenario, id }: { scenario: ScenarioDetail; id: string }) {
  const plan = validateDefinition(scenario.definition);
  const others = (await listProgress({ scenarioId: scenario.id })).map(toRule);
  const problems = checkDependents(plan, others, others.filter((o) => o.id !== id));
  if (problems.length) throw badRequest(problems, "Deleting this entry would leave later work ahead of it; nothing was deleted.");
}

type ReforecastBody = z.output<typeof reforecastSchema>;

/**
 * A data date a re-forecast (or a search from the field log) may start from, or the problem at `path`: inside the
 * plan's calendar, and not after today where the work is — progress after today cannot have been recorded, so a
 * later data date would forecast from a deck that pretends the days in between passed with no work.
 */
export function dataDateProblem(plan: { startDate: string; timeZone: string }, dataDate: string, path: string, now = new Date()): { path: string; message: string } | null {
  const last = formatDayNumber(parseIsoDate(plan.startDate) + HORIZON_DAYS - 1);
  if (dataDate < plan.startDate || dataDate > last) return { path, message: `Data date must be between the plan's start (${plan.startDate}) and ${last}` };
  const today = todayIn(plan.timeZone, now);
  if (dataDate > today) return { path, message: `Data date must not be in the future (today is ${today})` };
  return null;
}

/**
 * Queues a re-forecast from the as-built state at `dataDate`; a worker computes it and stores it as a run with
 * that data date. The job's key includes the field entries it uses, so a new entry means a new computation.
 * When the data date is today and the project's cached forecast is recent, the re-forecast starts from it
 * (./forecast/reforecast-input); the key names that forecast too, so a newer forecast is a new computation.
 */
export async function queueReforecast({ scenario, body, userId, automatic = false, now = new Date() }: { scenario: ScenarioDetail; body: ReforecastBody; userId: string; automatic?: boolean; now?: Date }) {
  const plan = validateDefinition(scenario.definition);
  const wrongDate = dataDateProblem(plan, body.dataDate, "dataDate", now);
  if (wrongDate) throw badRequest([wrongDate]);
  const today = todayIn(plan.timeZone, now);
  const overBudget = budgetProblem(plan, body.iterations, "server");
  if (overBudget) throw badRequest([overBudget], "The re-forecast is larger than the server's work budget; nothing was run or saved.");
  const rows = await listProgress({ scenarioId: scenario.id });
  const cached = body.dataDate === today ? await getCachedForecast({ projectId: scenario.projectId }) : null;
  const forecast = forecastForReforecast({ plan, dataDate: body.dataDate, today, now, cached });
  const hash = reforecastInputsHash({ definition: scenario.definition, records: rows.map(toRecord), dataDate: body.dataDate, seed: body.seed, iterations: body.iterations, forecast });
  const { job } = await queueRunJob({
    plan,
    projectId: scenario.projectId,
    computation: { scenarioId: scenario.id, scenarioVersion: scenario.version, seed: body.seed, iterations: body.iterations, reforecast: { dataDate: body.dataDate, inputsHash: hash } },
    userId,
    automatic,
    forecast,
  });
  return job;
}
