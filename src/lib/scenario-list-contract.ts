/**
 * What `GET /api/projects/:id/scenarios` answers: the project's scenarios, newest change first, each with its latest
 * forecast's headline, whether a browser run still waits for the server, and its newest re-forecast. One contract for
 * the two pages that read it (the project's scenario table and compare's checkboxes) and for `scenarioListAnswer`
 * (src/lib/server/read-answers.ts), which both Next and the fast path beside it (fast-reads.ts) send.
 * Times are ISO strings: what the JSON carries.
 */
import type { RunVerification } from "./run-contract";
import type { RunHeadline } from "./run-record";
import type { ScenarioRecord } from "./scenario-contract";

/** A scenario's own columns as one scenario's answer has them (without the plan itself), then its runs. */
export interface ScenarioListRow extends Omit<ScenarioRecord, "definition"> {
  /** The latest forecast (a plan run, not a re-forecast): all null when the scenario was never run. */
  runId: string | null;
  runVersion: number | null;
  runSummary: RunHeadline | null;
  runAt: string | null;
  runVerification: RunVerification | null;
  /** The data layer's rule: the plan changed after the run. */
  runStale: boolean | null;
  /** The run was computed under an earlier revision of the model rules (the data layer's `olderRules`). */
  runOlderRules: boolean | null;
  /** A newer browser run the server has not verified yet (not the forecast). */
  pendingRunAt: string | null;
  /** The newest re-forecast from the field log, if any: its P80 and data date. */
  reforecastP80: string | null;
  reforecastDataDate: string | null;
}

export interface ScenarioListAnswer {
  scenarios: ScenarioListRow[];
}
