/**
 * `npm run worker`: one engine worker process. It takes engine jobs from the queue (pg-boss on DATABASE_URL)
 * and runs them on worker threads, one per spare core (POURLINE_WORKER_THREADS overrides). Start as many as
 * you like, on as many machines as reach the database: they share the queue.
 *
 * Besides the work itself it keeps a heartbeat row, hands back the jobs of workers whose heartbeat stopped
 * (a `kill -9`, a lost machine) so pg-boss retries them, and queues a verification for any browser run that
 * is waiting without one.
 */
import { randomUUID } from "node:crypto";
import { availableParallelism, hostname } from "node:os";
import { closeDb, databaseUrl } from "../../db/client";
import { dropLease, heartbeatWorker, reapDeadWorkers, registerWorker, removeWorker, takeLease } from "../../db/queries/engine-workers";
import { ENGINE_QUEUE, openBoss, type EngineMessage } from "./boss";
import { handleMessage } from "./handlers";
import { sweepUncheckedRuns } from "./sweep";
import { ThreadPool, threadCount } from "./thread-pool";
import { tuneV8ForEngine } from "./engine-v8";

// Before any engine thread starts: the threads share this process's V8 settings (./engine-v8).
tuneV8ForEngine();

const HEARTBEAT_MS = 3_000;
/** A worker silent this long is taken for dead (ten missed heartbeats would be a very busy machine). */
const DEAD_AFTER_SECONDS = 20;
const SWEEP_MS = 30_000;

const log = (msg: string) => console.log(`[pourline worker] ${msg}`);

async function main() {
  const url = databaseUrl();
  const threads = threadCount(availableParallelism(), Number(process.env.POURLINE_WORKER_THREADS ?? 0));
  const workerId = randomUUID();
  const pool = new ThreadPool(threads);
  const boss = await openBoss(url, "worker");
  await registerWorker({ id: workerId, host: hostname(), pid: process.pid, threads });
  const held = new Set<string>();

  const beat = setInterval(async () => {
    try {
      if (!(await heartbeatWorker({ id: workerId }))) await registerWorker({ id: workerId, host: hostname(), pid: process.pid, threads });
      const orphans = await reapDeadWorkers({ staleSeconds: DEAD_AFTER_SECONDS });
      if (orphans.length) {
        await boss.fail(ENGINE_QUEUE, orphans);
        log(`handed back ${orphans.length} job(s) of a worker that stopped`);
      }
    } catch (e) {
      log(`heartbeat failed: ${e instanceof Error ? e.message : e}`);
    }
  }, HEARTBEAT_MS);

  const sweep = async () => {
    try {
      const n = await sweepUncheckedRuns(boss);
      if (n) log(`queued ${n} verification(s) of browser runs`);
    } catch (e) {
      log(`sweep failed: ${e instanceof Error ? e.message : e}`);
    }
  };
  const sweeper = setInterval(sweep, SWEEP_MS);
  void sweep();

  // One fetch loop per thread, one job at a time each: a thread is never asked to hold two tasks.
  for (let i = 0; i < threads; i++) {
    await boss.work<EngineMessage>(ENGINE_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
      held.add(job.id);
      await takeLease({ workerId, bossJobId: job.id });
      try {
        await handleMessage(pool, job.data);
      } finally {
        held.delete(job.id);
        await dropLease({ workerId, bossJobId: job.id }).catch(() => {});
      }
    });
  }
  log(`ready: ${threads} engine thread(s), pid ${process.pid}, worker ${workerId}`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log(`${signal}: stopping`);
    clearInterval(beat);
    clearInterval(sweeper);
    await pool.close();
    // Jobs in hand go back to the queue at once rather than waiting for another worker to notice.
    if (held.size) await boss.fail(ENGINE_QUEUE, [...held]).catch(() => {});
    await removeWorker({ id: workerId }).catch(() => {});
    await boss.stop({ graceful: false, wait: false }).catch(() => {});
    await closeDb();
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop("SIGTERM"));
  process.on("SIGINT", () => void stop("SIGINT"));
}

main().catch((e) => {
  console.error(`[pourline worker] could not start: ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
