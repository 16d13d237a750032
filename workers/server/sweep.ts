/** Browser runs waiting for verification that no verify job was ever queued for (e.g. stored before the queue existed). */
import type PgBoss from "pg-boss";
import { listUncheckedRuns } from "../../db/queries/runs";
import { verifyJobKey } from "../../src/lib/run-keys";
import { runWork, timeLimitSeconds } from "../../sim/budget";
import { getScenarioRevision } from "../../db/queries/jobs";
import { parseScenario } from "../../sim/validate";
import { enqueueJob } from "./enqueue";

type Sized = Parameters<typeof runWork>[0];

export async function queueVerification(boss: PgBoss, run: { id: string; projectId: string; scenarioId: string; scenarioVersion: number; seed: string; iterations: number; createdById: string | null }, definition: Sized) {
  return enqueueJob(boss, {
    kind: "verify",
    projectId: run.projectId,
    scenarioId: run.scenarioId,
    scenarioVersion: run.scenarioVersion,
    seed: run.seed,
    iterations: run.iterations,
    runId: run.id,
    singletonKey: verifyJobKey(run.id),
    totalUnits: run.iterations,
    timeLimitSeconds: timeLimitSeconds(runWork(definition, run.iterations).total),
    userId: run.createdById,
  });
}

export async function sweepUncheckedRuns(boss: PgBoss): Promise<number> {
  let n = 0;
  for (const run of await listUncheckedRuns()) {
    const parsed = parseScenario(await getScenarioRevision({ scenarioId: run.scenarioId, version: run.scenarioVersion }));
    if (!parsed.ok) continue;
    const { created } = await queueVerification(boss, run, parsed.scenario);
    if (created) n++;
  }
  return n;
}
