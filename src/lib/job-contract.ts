/**
 * What the engine-job routes answer — `GET /api/jobs/:id` and `DELETE` (cancel), and the 202 of the routes that
 * queue one: `POST /api/scenarios/:id/reforecast`, a server run (`POST /api/scenarios/:id/runs` without a summary)
 * and a plan search (`POST /api/scenarios/:id/searches`, in ./search-contract). One shape, built by `jobView`
 * (src/lib/server/jobs.ts) and followed by the browser's `useJob`, so a progress bar reads what the server says.
 * Times are ISO strings: what the JSON carries.
 */

/** The kinds and states of the data layer's `engine_jobs` (db/schema.ts); the server's answer is checked against them. */
export type JobKind = "run" | "reforecast" | "verify" | "search";
export type JobStatus = "queued" | "running" | "completed" | "failed" | "cancelled";

export interface JobView {
  id: string;
  kind: JobKind;
  status: JobStatus;
  scenarioId: string;
  scenarioVersion: number;
  seed: string;
  iterations: number;
  /** Set on a re-forecast only. */
  dataDate: string | null;
  /** The time left is null until a running job has done some of its work: no estimate from nothing. */
  progress: { done: number; total: number; fraction: number; secondsLeft: number | null };
  timeLimitSeconds: number;
  /** A verification's run to check; a run's or a re-forecast's stored result once done. */
  runId: string | null;
  searchId: string | null;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export interface JobAnswer {
  job: JobView;
}
