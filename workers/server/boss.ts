/**
 * The job queue: pg-boss on the app's own database (schema `pgboss`). The web server only sends; worker
 * processes fetch, and one of them also runs pg-boss's maintenance (expiring jobs that outlive their time
 * limit, retrying them, archiving old ones). `installQueue` runs with the database migrations, as the app's
 * own database role (`pourline_app`, which owns the database: scripts/app-db-role.mjs), so the `pgboss` schema
 * belongs to the same role the web server and the workers connect as, and no superuser is needed.
 */
import PgBoss from "pg-boss";
import type { ForecastInput } from "../../src/lib/run-record";

export const ENGINE_QUEUE = "engine";

/**
 * What pg-boss carries: which engine job, for a search which of its variants, and for a re-forecast from the
 * weather forecast the forecast itself — the job's key names it (its fetch time and hours), and the cache may
 * hold a newer one by the time a worker starts, so the forecast travels with the message (and with its retries).
 */
export interface EngineMessage {
  jobId: string;
  variant?: number;
  forecast?: ForecastInput;
}

/** A crash (kill -9, a lost machine) is retried twice, a few seconds later. */
const QUEUE_OPTIONS = { name: ENGINE_QUEUE, policy: "short" as const, retryLimit: 2, retryDelay: 2, retryBackoff: false };

export async function openBoss(url: string, role: "web" | "worker"): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString: url,
    application_name: `pourline-${role}`,
    max: role === "web" ? 2 : 4,
    migrate: false,
    supervise: role === "worker",
    schedule: false,
    maintenanceIntervalSeconds: 15,
  });
  // pg-boss reports background problems as events; an unhandled 'error' event would end the process.
  boss.on("error", (e) => console.error(`[pourline] job queue: ${e.message}`));
  await boss.start();
  return boss;
}

/** Creates pg-boss's schema and the engine queue when missing (idempotent). */
export async function installQueue(url: string): Promise<void> {
  const boss = new PgBoss({ connectionString: url, max: 1, supervise: false, schedule: false, migrate: true, application_name: "pourline-migrate" });
  boss.on("error", (e) => console.error(`[pourline] job queue: ${e.message}`));
  await boss.start();
  try {
    if (!(await boss.getQueue(ENGINE_QUEUE))) await boss.createQueue(ENGINE_QUEUE, QUEUE_OPTIONS);
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}
