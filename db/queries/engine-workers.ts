import "server-only";
/**
 * Liveness of worker processes. Each refreshes its row every few seconds and records the pg-boss jobs it
 * holds; a worker whose heartbeat stopped (killed, machine lost) is removed by any other worker, and the
 * jobs it held are handed back to the queue.
 */
import { and, eq, inArray, lt, sql } from "drizzle-orm";
import { getDb } from "../client";
import { engineLeases, engineWorkers } from "../schema";

export async function registerWorker(input: { id: string; host: string; pid: number; threads: number }) {
  await getDb().insert(engineWorkers).values(input);
}

export async function heartbeatWorker({ id }: { id: string }) {
  const rows = await getDb().update(engineWorkers).set({ heartbeatAt: new Date() }).where(eq(engineWorkers.id, id)).returning({ id: engineWorkers.id });
  return rows.length > 0;
}

export async function removeWorker({ id }: { id: string }) {
  await getDb().delete(engineWorkers).where(eq(engineWorkers.id, id));
}

export async function takeLease({ workerId, bossJobId }: { workerId: string; bossJobId: string }) {
  await getDb().insert(engineLeases).values({ workerId, bossJobId }).onConflictDoUpdate({ target: engineLeases.bossJobId, set: { workerId, startedAt: new Date() } });
}

export async function dropLease({ workerId, bossJobId }: { workerId: string; bossJobId: string }) {
  await getDb().delete(engineLeases).where(and(eq(engineLeases.bossJobId, bossJobId), eq(engineLeases.workerId, workerId)));
}

/** Removes workers silent for `staleSeconds` and returns the pg-boss jobs they held. */
export async function reapDeadWorkers({ staleSeconds }: { staleSeconds: number }): Promise<string[]> {
  return getDb().transaction(async (tx) => {
    const dead = await tx
      .select({ id: engineWorkers.id })
      .from(engineWorkers)
      .where(lt(engineWorkers.heartbeatAt, sql`now() - make_interval(secs => ${staleSeconds})`))
      .for("update", { skipLocked: true });
    if (dead.length === 0) return [];
    const ids = dead.map((d) => d.id);
    const leases = await tx.select({ bossJobId: engineLeases.bossJobId }).from(engineLeases).where(inArray(engineLeases.workerId, ids));
    await tx.delete(engineWorkers).where(inArray(engineWorkers.id, ids)); // their leases go with them (cascade)
    return leases.map((l) => l.bossJobId);
  });
}

export async function countLiveWorkers() {
  const [row] = await getDb().select({ workers: sql<number>`count(*)::int`, threads: sql<number>`coalesce(sum(${engineWorkers.threads}), 0)::int` }).from(engineWorkers);
  return row;
}
