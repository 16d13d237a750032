/**
 * What a worker does with one message from the queue. The engine job row decides: a job already finished or
 * cancelled is acknowledged without work; otherwise the task runs on a thread, progress is written about once
 * a second (which is also when a cancel is noticed), the time limit stops the thread, and the result is
 * stored under its result key — so a job retried after a crash stores its result once.
 */
import { claimEngineJob, finishEngineJob, getEngineJob, getScenarioRevision, reportEngineProgress, type EngineJob } from "../../db/queries/jobs";
import { getRunForCheck, saveRun, setRunVerification } from "../../db/queries/runs";
import { listProgress } from "../../db/queries/progress";
import { getSearch, getSearchFieldLog, getVariant, saveVariantOutcome, variantProgress } from "../../db/queries/searches";
import { applyVariant } from "../../sim/search";
import { parseScenario } from "../../sim/validate";
import type { ScenarioInput } from "../../sim/schema";
import type { ProgressRecord } from "../../sim/index";
import { reforecastInputsHash, storedReforecast, storedRun, type ForecastInput } from "../../src/lib/run-record";
import { resultKey, runJobKey } from "../../src/lib/run-keys";
import type { EngineMessage } from "./boss";
import type { EngineTask, TaskResult } from "./tasks";
import { TaskStopped, type ThreadPool } from "./thread-pool";

const PROGRESS_WRITE_MS = 1000;
const log = (msg: string) => console.log(`[pourline worker] ${msg}`);

/** Runs a task with progress, cancel and the time limit; null when it was cancelled or ran out of time. */
async function runWatched(pool: ThreadPool, job: EngineJob, task: EngineTask, unitsBefore: number): Promise<TaskResult | null> {
  let done = 0;
  const running = pool.run(task, (d) => (done = d));
  const timer = setTimeout(() => running.stop("time limit"), job.timeLimitSeconds * 1000);
  const watcher = setInterval(async () => {
    try {
      const status = await reportEngineProgress({ id: job.id, doneUnits: unitsBefore + done });
      if (status === "cancelled" || status === null) running.stop("cancelled");
    } catch (e) {
      log(`progress of job ${job.id} not written: ${e instanceof Error ? e.message : e}`);
    }
  }, PROGRESS_WRITE_MS);
  try {
    return await running.result;
  } catch (e) {
    if (!(e instanceof TaskStopped)) throw e;
    if (e.message === "time limit") {
      await finishEngineJob({ id: job.id, status: "failed", error: `Stopped: the job ran longer than its time limit of ${job.timeLimitSeconds} s.` });
      log(`job ${job.id} (${job.kind}) stopped at its time limit`);
    } else log(`job ${job.id} (${job.kind}) cancelled; its thread is free again`);
    return null;
  } finally {
    clearTimeout(timer);
    clearInterval(watcher);
  }
}

/** The saved revision the job names, parsed (every saved revision passed parseScenario when it was saved). */
async function definitionOf(job: EngineJob): Promise<ScenarioInput | null> {
  const parsed = parseScenario(await getScenarioRevision({ scenarioId: job.scenarioId, version: job.scenarioVersion }));
  return parsed.ok ? parsed.scenario : null;
}

async function handleSingle(pool: ThreadPool, job: EngineJob, forecast: ForecastInput | null) {
  const definition = await definitionOf(job);
  if (!definition) return void (await finishEngineJob({ id: job.id, status: "failed", error: "The scenario version no longer exists." }));
  const base = { definition, seed: job.seed, iterations: job.iterations };
  const started = Date.now();
  if (job.kind === "verify") {
    const run = job.runId ? await getRunForCheck({ id: job.runId }) : null;
    if (!run) return void (await finishEngineJob({ id: job.id, status: "failed", error: "The run to verify no longer exists." }));
    if (run.verification !== "pending") return void (await finishEngineJob({ id: job.id, status: "completed", runId: run.id }));
    const r = await runWatched(pool, job, { kind: "verify", ...base, claimed: run.results }, 0);
    if (!r) return;
    if (r.kind !== "verify") return void (await finishEngineJob({ id: job.id, status: "failed", error: r.kind === "infeasible" ? r.problem : "unexpected result" }));
    await setRunVerification({ id: run.id, verification: r.matches ? "verified" : "rejected" });
    if (!r.matches) console.warn(`[pourline worker] run ${run.id} REJECTED: the server's summary differs from the stored one (first at ${r.firstDifference}); it is not shown as the forecast`);
    return void (await finishEngineJob({ id: job.id, status: "completed", runId: run.id }));
  }
  let task: EngineTask;
  let reforecast: { dataDate: string; inputsHash: string } | null = null;
  let records: ProgressRecord[] = [];
  const raw = await getScenarioRevision({ scenarioId: job.scenarioId, version: job.scenarioVersion });
  if (job.kind === "reforecast" && job.dataDate) {
    const rows = await listProgress({ scenarioId: job.scenarioId });
    records = rows.map((r) => ({ workDate: r.workDate, shift: r.shift, operationId: r.operationId, fromStationFt: r.fromStationFt, toStationFt: r.toStationFt, discovered: r.discovered }));
    reforecast = { dataDate: job.dataDate, inputsHash: reforecastInputsHash({ definition: raw, records, dataDate: job.dataDate, seed: job.seed, iterations: job.iterations, forecast }) };
    // The job names the field entries (and the weather forecast) it was asked for; if they changed since, this is another computation.
    if (job.singletonKey !== runJobKey({ scenarioId: job.scenarioId, scenarioVersion: job.scenarioVersion, seed: job.seed, iterations: job.iterations, reforecast })) {
      return void (await finishEngineJob({ id: job.id, status: "failed", error: "The field log changed after this re-forecast was asked for; ask for it again." }));
    }
    task = { kind: "reforecast", ...base, dataDate: job.dataDate, records, forecast: forecast?.hourly ?? null };
  } else task = { kind: "run", ...base };
  const r = await runWatched(pool, job, task, 0);
  if (!r) return;
  if (r.kind === "infeasible") return void (await finishEngineJob({ id: job.id, status: "failed", error: `The scenario is not valid: ${r.problem}` }));
  if (r.kind !== "run" && r.kind !== "reforecast") return void (await finishEngineJob({ id: job.id, status: "failed", error: "unexpected result" }));
  const common = { definition: raw, seed: job.seed, iterations: job.iterations, summary: r.summary, durationMs: Date.now() - started };
  // The same stored columns as the demo seed's (src/lib/run-record.ts).
  const columns =
    r.kind === "reforecast" && job.dataDate
      ? (({ headline: _h, reforecast: _r, ...c }) => c)(storedReforecast({ ...common, records, dataDate: job.dataDate, reforecast: r.reforecast, forecast }))
      : { ...storedRun(common), dataDate: null };
  const saved = await saveRun({
    scenarioId: job.scenarioId,
    scenarioVersion: job.scenarioVersion,
    ...columns,
    userId: job.createdById,
    verification: "server",
    resultKey: resultKey({ scenarioId: job.scenarioId, scenarioVersion: job.scenarioVersion, seed: job.seed, iterations: job.iterations, reforecast }),
  });
  await finishEngineJob({ id: job.id, status: "completed", runId: saved.id });
}

async function handleVariant(pool: ThreadPool, job: EngineJob, idx: number) {
  if (!job.searchId) return;
  const [search, variant] = await Promise.all([getSearch({ id: job.searchId }), getVariant({ searchId: job.searchId, idx })]);
  if (!search || !variant || variant.status !== "pending") return;
  const definition = await definitionOf(job);
  if (!definition) return void (await finishEngineJob({ id: job.id, status: "failed", error: "The scenario version no longer exists." }));
  const plan = variant.choice ? applyVariant(definition, search.spec.dimensions, variant.choice) : definition;
  const progress = await variantProgress({ searchId: job.searchId });
  const from = search.spec.fromFieldLog;
  const fromFieldLog = from ? { dataDate: from.dataDate, records: (await getSearchFieldLog({ id: job.searchId })) ?? [] } : null;
  const r = await runWatched(pool, job, { kind: "variant", definition: plan, seed: job.seed, iterations: job.iterations, fromFieldLog }, progress.finished * job.iterations);
  if (!r) return;
  if (r.kind === "variant") await saveVariantOutcome({ searchId: job.searchId, idx, status: "done", outcome: r.outcome, problem: null });
  else await saveVariantOutcome({ searchId: job.searchId, idx, status: "infeasible", outcome: null, problem: r.kind === "infeasible" ? r.problem : "unexpected result" });
  const after = await variantProgress({ searchId: job.searchId });
  await reportEngineProgress({ id: job.id, doneUnits: after.finished * job.iterations });
  if (after.finished >= after.total) await finishEngineJob({ id: job.id, status: "completed" });
}

export async function handleMessage(pool: ThreadPool, message: EngineMessage) {
  const current = await getEngineJob({ id: message.jobId });
  if (!current || !["queued", "running"].includes(current.status)) return; // done, cancelled or gone: nothing to do
  const job = await claimEngineJob({ id: current.id });
  if (!job) return;
  try {
    if (job.kind === "search") await handleVariant(pool, job, message.variant ?? -1);
    else await handleSingle(pool, job, message.forecast ?? null);
  } catch (e) {
    // An engine error is deterministic: retrying would fail the same way, so the job fails with the reason.
    const reason = e instanceof Error ? e.message : String(e);
    log(`job ${job.id} (${job.kind}) failed: ${reason}`);
    if (job.kind === "search" && job.searchId && message.variant !== undefined) {
      await saveVariantOutcome({ searchId: job.searchId, idx: message.variant, status: "failed", outcome: null, problem: reason });
      const after = await variantProgress({ searchId: job.searchId });
      if (after.finished >= after.total) await finishEngineJob({ id: job.id, status: "completed" });
    } else await finishEngineJob({ id: job.id, status: "failed", error: `The engine failed: ${reason}` });
  }
}
