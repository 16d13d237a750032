import "server-only";
/**
 * The look-ahead board of a scenario: today's date on the scenario's clock, the project's cached forecast
 * (./forecast/cache), and the pure evaluation (sim/lookahead). Works without a forecast: cells are then
 * "cannot tell" and the message says why.
 */
import { localDate } from "@/lib/local-clock";
import { lookAhead, nextOpenAfter, DEFAULT_RAIN_POP_PCT } from "@sim/lookahead";
import { getProject } from "@db/queries/projects";
import { everyCellClosed } from "@/lib/look-ahead-notice";
import type { LookAheadBoard } from "@/lib/look-ahead-contract";
import { projectForecast } from "./forecast/cache";
import { toHourlyArrays } from "./forecast/nws-format";
import { validateDefinition } from "./scenario-input";

export const RAIN_RULE = `An hour counts as rain when its chance of precipitation is ${DEFAULT_RAIN_POP_PCT} % or more.`;

/**
 * The forecast's source as the board names it. `npm start` and the tests run a local stand-in with invented weeks
 * (FORECAST_FAKE=1): a board that said "the National Weather Service" then would pass invented weather off as real.
 */
export function forecastSourceName(env: Record<string, string | undefined> = process.env): string {
  return env.FORECAST_FAKE === "1" ? "the local stand-in weather service (invented weather for the demo, not a real forecast)" : "the National Weather Service";
}

export async function scenarioLookAhead(scenario: { projectId: string; definition: unknown }, now = new Date()): Promise<LookAheadBoard> {
  const plan = validateDefinition(scenario.definition);
  const project = await getProject({ id: scenario.projectId });
  const state = await projectForecast({ id: scenario.projectId, latitude: project?.latitude ?? null, longitude: project?.longitude ?? null }, now);
  const today = localDate(now, plan.timeZone);
  const f = state.forecast;
  const hours = f?.hours ?? [];
  const days = lookAhead(plan, toHourlyArrays(hours), { today });
  return {
    today,
    timeZone: plan.timeZone,
    rainRule: RAIN_RULE,
    forecast: {
      status: state.status,
      source: forecastSourceName(),
      message: state.message,
      fetchedAt: state.fetchedAt?.toISOString() ?? null,
      ageMinutes: state.ageMinutes === null ? null : Math.round(state.ageMinutes),
      place: f?.place ?? null,
      office: f?.office ?? null,
      generatedAt: f?.generatedAt ?? null,
      firstHour: hours[0]?.start ?? null,
      lastHour: hours[hours.length - 1]?.start ?? null,
      gaps: f?.gaps ?? null,
    },
    days,
    nextOpen: everyCellClosed(days) ? nextOpenAfter(plan, { today }) : null,
  };
}
