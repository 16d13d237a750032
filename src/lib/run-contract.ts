/**
 * What `POST /api/scenarios/:id/runs` answers, built by `recordRun` (src/lib/server/runs.ts). A run computed in a
 * browser arrives with its summary and is stored at once, but it is not the forecast until the server has
 * reproduced it: the 201 names the verify job to follow (`verifyJobId`, null when an identical run was already
 * stored and checked). A run without a summary is queued for a worker instead: a 202 with the job (./job-contract).
 */
import type { JobAnswer } from "./job-contract";
import type { RunHeadline } from "./run-record";

/** The data layer's `RunVerification` (db/schema.ts): who stands behind a stored run's numbers. */
export type RunVerification = "server" | "pending" | "verified" | "rejected";

export interface RunStoredAnswer {
  id: string;
  createdAt: string;
  scenarioVersion: number;
  headline: RunHeadline;
  verification: RunVerification;
  verifyJobId: string | null;
}

export type RunRecordAnswer = RunStoredAnswer | JobAnswer;
