import { MODEL_REVISION } from "@sim/model-revision";

/**
 * Names of computations. A result key says what a stored run is the result of, so the same computation is
 * stored once whoever asks (a browser run and a server run of the same scenario version, seed and iterations
 * share one); a job key says what an engine job computes, so asking twice gives the same job. Both name the
 * model rules' revision too: after a rule change the same inputs are a new computation.
 */
export interface Computation {
  scenarioId: string;
  scenarioVersion: number;
  seed: string;
  iterations: number;
  /** A re-forecast's data date and a digest of the field entries it used (null for a plan run). */
  reforecast?: { dataDate: string; inputsHash: string } | null;
}

export function resultKey(c: Computation): string {
  const base = `${c.scenarioId}:v${c.scenarioVersion}:${c.iterations}:${JSON.stringify(c.seed)}:m${MODEL_REVISION}`;
  return c.reforecast ? `${base}:reforecast:${c.reforecast.dataDate}:${c.reforecast.inputsHash}` : `${base}:plan`;
}

export const runJobKey = (c: Computation) => `${c.reforecast ? "reforecast" : "run"}:${resultKey(c)}`;
export const verifyJobKey = (runId: string) => `verify:${runId}`;
export const searchJobKey = (searchId: string) => `search:${searchId}`;

/**
 * Within one scenario, what a plan run computed: the same version, iterations and seed give the same summary
 * (the engine is deterministic). The Outlook uses it to tell the run a browser just computed from the run the
 * server's page shows.
 */
export const planComputationKey = (c: { scenarioVersion: number; iterations: number; seed: string }) => `v${c.scenarioVersion}:${c.iterations}:${JSON.stringify(c.seed)}`;
