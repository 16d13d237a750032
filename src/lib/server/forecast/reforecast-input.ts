/**
 * Which weather forecast a re-forecast starts from (MODEL.md, "Re-forecast from the weather forecast"): the
 * project's cached forecast, when the re-forecast's data date is today on the scenario's clock, the forecast
 * was fetched at most `MAX_AGE_MS` ago, it is for the scenario's time zone (its hours are wall-clock hours)
 * and it holds at least one whole day after the data date. Otherwise none: the re-forecast runs on the
 * climate profile as before. Only the cache is read — a re-forecast never waits for the weather service.
 * Pure (the caller reads the cache row), so the web server and the worker decide alike.
 */
import { weatherOverride } from "@sim/forecast-weather";
import type { Scenario } from "@sim/schema";
import type { ForecastInput } from "@/lib/run-record";
import { toHourlyArrays, type ForecastHour } from "./nws-format";

/**
 * A forecast fetched this long ago still leads a re-forecast. Our choice, no published source: the service
 * updates its grids about hourly, but a few hours' age barely moves the next days, and the cache is refreshed
 * only when someone reads the week ahead.
 */
export const MAX_AGE_MS = 6 * 60 * 60_000;
export const MAX_AGE_HOURS = MAX_AGE_MS / 3_600_000;

interface CachedRow {
  data: Record<string, unknown> | null;
  fetchedAt: Date | null;
}

export function forecastForReforecast(args: { plan: Scenario; dataDate: string; today: string; now: Date; cached: CachedRow | null }): ForecastInput | null {
  const { plan, dataDate, today, now, cached } = args;
  if (dataDate !== today || !cached?.data || !cached.fetchedAt) return null;
  const age = now.getTime() - cached.fetchedAt.getTime();
  if (!(age >= -60_000 && age <= MAX_AGE_MS)) return null;
  const data = cached.data as { hours?: unknown; timeZone?: unknown; generatedAt?: unknown };
  if (typeof data.timeZone === "string" && data.timeZone !== plan.timeZone) return null;
  if (!Array.isArray(data.hours)) return null;
  const hourly = toHourlyArrays(data.hours as ForecastHour[]);
  if (!hourly || !weatherOverride(plan, hourly, dataDate)) return null;
  return { fetchedAt: cached.fetchedAt.toISOString(), generatedAt: typeof data.generatedAt === "string" ? data.generatedAt : null, hourly };
}
