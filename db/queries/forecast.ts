import "server-only";
/**
 * Project locations and the shared forecast cache (one row per project). `claimForecastFetch` is the one
 * place that decides whether a caller may ask the weather service now: a single upsert that succeeds only when
 * the cached forecast is older than `freshMs` (or for another location) and no attempt was made in the last
 * `retryMs`, so concurrent readers never fetch twice.
 */
import { eq, sql } from "drizzle-orm";
import { getDb } from "../client";
import { projectForecasts, projects } from "../schema";

export async function setProjectLocation({ projectId, latitude, longitude }: { projectId: string; latitude: number | null; longitude: number | null }) {
  await getDb().update(projects).set({ latitude, longitude }).where(eq(projects.id, projectId));
}

export async function getCachedForecast({ projectId }: { projectId: string }) {
  const [row] = await getDb().select().from(projectForecasts).where(eq(projectForecasts.projectId, projectId));
  return row ?? null;
}
export type CachedForecastRow = NonNullable<Awaited<ReturnType<typeof getCachedForecast>>>;

export async function claimForecastFetch(input: { projectId: string; latitude: number; longitude: number; now: Date; freshMs: number; retryMs: number }): Promise<boolean> {
  const t = projectForecasts;
  // As ISO text with a cast: a Date inside a raw `sql` fragment is not serialized by the driver.
  const freshBefore = sql`${new Date(input.now.getTime() - input.freshMs).toISOString()}::timestamptz`;
  const retryBefore = sql`${new Date(input.now.getTime() - input.retryMs).toISOString()}::timestamptz`;
  const moved = sql`(${t.latitude} <> excluded.latitude OR ${t.longitude} <> excluded.longitude)`;
  const rows = await getDb()
    .insert(t)
    .values({ projectId: input.projectId, latitude: input.latitude, longitude: input.longitude, lastAttemptAt: input.now })
    .onConflictDoUpdate({
      target: t.projectId,
      set: {
        latitude: sql`excluded.latitude`,
        longitude: sql`excluded.longitude`,
        lastAttemptAt: sql`excluded.last_attempt_at`,
        // A forecast for another place is of no use: drop it with the move.
        data: sql`CASE WHEN ${moved} THEN NULL ELSE ${t.data} END`,
        fetchedAt: sql`CASE WHEN ${moved} THEN NULL ELSE ${t.fetchedAt} END`,
        lastError: sql`CASE WHEN ${moved} THEN NULL ELSE ${t.lastError} END`,
      },
      setWhere: sql`${moved} OR ((${t.fetchedAt} IS NULL OR ${t.fetchedAt} < ${freshBefore}) AND (${t.lastAttemptAt} IS NULL OR ${t.lastAttemptAt} < ${retryBefore}))`,
    })
    .returning({ projectId: t.projectId });
  return rows.length > 0;
}

export async function saveForecast({ projectId, data, fetchedAt }: { projectId: string; data: Record<string, unknown>; fetchedAt: Date }) {
  await getDb().update(projectForecasts).set({ data, fetchedAt, lastError: null }).where(eq(projectForecasts.projectId, projectId));
}

export async function saveForecastError({ projectId, error }: { projectId: string; error: string }) {
  await getDb().update(projectForecasts).set({ lastError: error.slice(0, 500) }).where(eq(projectForecasts.projectId, projectId));
}
