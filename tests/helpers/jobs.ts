/** Following engine jobs from tests, over HTTP as the browser does; and the worker's row in the database. */
import postgres from "postgres";
import { call } from "./app";

export interface JobReply {
  id: string;
  kind: string;
  status: "queued" | "running" | "completed" | "failed" | "cancelled";
  progress: { done: number; total: number; fraction: number; secondsLeft: number | null };
  runId: string | null;
  searchId: string | null;
  error: string | null;
}

const ended = (j: JobReply) => j.status === "completed" || j.status === "failed" || j.status === "cancelled";

/** Polls GET /api/jobs/:id until `until` holds (default: the job ended); bounded in time. */
export async function waitForJob(id: string, cookie: string, opts: { timeoutMs?: number; until?: (j: JobReply) => boolean } = {}): Promise<JobReply> {
  const until = opts.until ?? ended;
  const deadline = Date.now() + (opts.timeoutMs ?? 120_000);
  for (;;) {
    const res = await call(`/api/jobs/${id}`, { cookie });
    if (res.status !== 200) throw new Error(`GET /api/jobs/${id}: ${res.status} ${JSON.stringify(res.body)}`);
    const job = res.body.job as JobReply;
    if (until(job)) return job;
    if (ended(job)) throw new Error(`job ${id} ended (${job.status}: ${job.error}) before the awaited state`);
    if (Date.now() > deadline) throw new Error(`job ${id} still ${job.status} (${job.progress.done}/${job.progress.total}) after ${opts.timeoutMs ?? 120_000} ms`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

/** A short-lived connection to the app's own database (the one the app and its worker use). */
export async function withAppDb<T>(fn: (sql: postgres.Sql) => Promise<T>): Promise<T> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: run these tests through `npm test`.");
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  try {
    return await fn(sql);
  } finally {
    await sql.end({ timeout: 5 });
  }
}

/** A run the server's engine workers compute: asked for (202 with its job) and waited for; the finished job. */
export async function serverRunDone(scenarioId: string, cookie: string, body: { seed: string; iterations: number }): Promise<JobReply> {
  const res = await call(`/api/scenarios/${scenarioId}/runs`, { method: "POST", cookie, body });
  if (res.status !== 202) throw new Error(`POST /api/scenarios/${scenarioId}/runs: ${res.status} ${JSON.stringify(res.body)}`);
  return waitForJob(res.body.job.id, cookie);
}
