/**
 * What the compare API (`GET /api/projects/:id/compare?ids=…`) takes and returns — one contract for the route, the
 * compare page and its table. `parseCompareIds` accepts 1–4 distinct ids separated by commas and names the field
 * `ids` in every problem; each scenario comes back with its latest plan run's compare figures, which are the run
 * summary's own (sim `CompareFigures`), or `run: null`, and its newest re-forecast's headline, or `reforecast: null`.
 */
import type { CompareFigures } from "@sim/run-summary-schema";
import type { RunVerification } from "./run-contract";

export const MAX_COMPARE = 4;

export type IdsResult = { ok: true; ids: string[] } | { ok: false; message: string };

export function parseCompareIds(raw: string | null | undefined): IdsResult {
  const ids = (raw ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  if (ids.length < 1) return { ok: false, message: "must list at least one scenario id" };
  if (ids.length > MAX_COMPARE) return { ok: false, message: `must list at most ${MAX_COMPARE} scenario ids` };
  if (new Set(ids).size !== ids.length) return { ok: false, message: "must not list a scenario twice" };
  return { ok: true, ids };
}

/** A scenario's latest forecast as compare shows it: the run's compare figures and what the table says beside them. */
export type CompareRun = CompareFigures & {
  id: string;
  scenarioVersion: number;
  stale: boolean;
  /** Computed under an earlier revision of the model rules (the data layer's `olderRules`). */
  olderRules: boolean;
  /** "server" or "verified": compare shows forecasts only (the data layer leaves pending and rejected runs out). */
  verification: RunVerification;
  iterations: number;
  createdAt: string;
  /** Lane-closed hours, P50 (crew closure hours for runs stored before the closure timeline). */
  closureHoursTotal: number;
};

/**
 * A scenario's newest re-forecast from its field log, in brief. On a job under way compare's figures are plan runs
 * from the plan's start, which know nothing of the work done; this is what the field log has made of the plan.
 */
export interface CompareReforecast {
  /** The data date: the work recorded up to this day (yyyy-mm-dd). */
  dataDate: string;
  createdAt: string;
  p50: string;
  p80: string;
  targetDate: string | null;
  targetProbability: number | null;
  /** The plan changed after it (the data layer's stale rule). */
  stale: boolean;
  /** Computed under an earlier revision of the model rules. */
  olderRules: boolean;
}

export interface CompareScenario {
  id: string;
  name: string;
  version: number;
  run: CompareRun | null;
  /** Null when the scenario has never been re-forecast from a field log. */
  reforecast: CompareReforecast | null;
}

/** In the order the ids were asked for. */
export interface CompareAnswer {
  scenarios: CompareScenario[];
}
