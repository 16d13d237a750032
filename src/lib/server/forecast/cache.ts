import "server-only";
/**
 * The project's forecast as everyone sees it: fetched at most once an hour per project and kept in
 * PostgreSQL (db/queries/forecast.ts), shared by every reader. After a failed attempt the next one waits
 * `RETRY_AFTER_MS` so a service that is down is not asked on every page view; meanwhile the last good forecast
 * is served with its age and a plain message. Nothing here throws for a service failure.
 */
import { claimForecastFetch, getCachedForecast, saveForecast, saveForecastError } from "@db/queries/forecast";
import type { ForecastStatus } from "@/lib/look-ahead-contract";
import { fetchHourlyForecast, ForecastError, type FetchedForecast } from "./nws-client";

export const FRESH_MS = 60 * 60_000;
export const RETRY_AFTER_MS = 10 * 60_000;

export interface ProjectForecast {
  status: ForecastStatus;
  forecast: FetchedForecast | null;
  fetchedAt: Date | null;
  /** Minutes since the forecast was fetched. */
  ageMinutes: number | null;
  /** What a person should know (null when all is well). */
  message: string | null;
}

function describeAge(minutes: number): string {
  if (minutes < 90) return `${Math.max(1, Math.round(minutes))} min`;
  if (minutes < 48 * 60) return `${Math.round(minutes / 60)} h`;
  return `${Math.round(minutes / 1440)} days`;
}

export async function projectForecast(project: { id: string; latitude: number | null; longitude: number | null }, now = new Date()): Promise<ProjectForecast> {
  if (project.latitude === null || project.longitude === null)
    return { status: "noLocation", forecast: null, fetchedAt: null, ageMinutes: null, message: "The project has no location yet, so there is no forecast. An administrator or engineer can set it on the project page." };
  const loc = { latitude: project.latitude, longitude: project.longitude };
  if (await claimForecastFetch({ projectId: project.id, ...loc, now, freshMs: FRESH_MS, retryMs: RETRY_AFTER_MS })) {
    try {
      const fetched = await fetchHourlyForecast(loc.latitude, loc.longitude);
      await saveForecast({ projectId: project.id, data: fetched as unknown as Record<string, unknown>, fetchedAt: new Date() });
    } catch (e) {
      const message = e instanceof ForecastError ? e.message : "The forecast could not be read.";
      if (!(e instanceof ForecastError)) console.error("[pourline] forecast fetch failed", e);
      await saveForecastError({ projectId: project.id, error: message });
    }
  }
  const row = await getCachedForecast({ projectId: project.id });
  const forecast = (row?.data ?? null) as FetchedForecast | null;
  const fetchedAt = row?.fetchedAt ?? null;
  const ageMinutes = fetchedAt ? (now.getTime() - fetchedAt.getTime()) / 60_000 : null;
  const failed = row?.lastError ?? null;
  if (!forecast) return { status: "none", forecast: null, fetchedAt: null, ageMinutes: null, message: `No forecast yet. ${failed ?? "It is being fetched; reload in a moment."}` };
  const stale = failed !== null || (ageMinutes ?? 0) * 60_000 > FRESH_MS + RETRY_AFTER_MS;
  if (!stale) return { status: "fresh", forecast, fetchedAt, ageMinutes, message: null };
  return {
    status: "stale",
    forecast,
    fetchedAt,
    ageMinutes,
    message: `${failed ?? "The forecast could not be refreshed."} Showing the last forecast, fetched ${describeAge(ageMinutes ?? 0)} ago.`,
  };
}
