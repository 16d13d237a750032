import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { simulationRuns, users } from "../schema";

export async function saveRun(input: {
  scenarioId: string;
  scenarioVersion: number;
  inputsHash: string;
  seed: string;
  iterations: number;
  summary: Record<string, unknown>;
  results: Record<string, unknown>;
  durationMs: number;
  userId: string | null;
}) {
  const [row] = await getDb()
    .insert(simulationRuns)
    .values({ ...input, createdById: input.userId })
    .returning({ id: simulationRuns.id, createdAt: simulationRuns.createdAt });
  return row;
}

/** Runs of the plan itself; re-forecasts (with a data date) are listed with the field log instead. */
const planRunsOf = (scenarioId: string) => and(eq(simulationRuns.scenarioId, scenarioId), isNull(simulationRuns.dataDate));

const listColumns = {
  id: simulationRuns.id,
  scenarioId: simulationRuns.scenarioId,
  scenarioVersion: simulationRuns.scenarioVersion,
  inputsHash: simulationRuns.inputsHash,
  seed: simulationRuns.seed,
  iterations: simulationRuns.iterations,
  summary: simulationRuns.summary,
  durationMs: simulationRuns.durationMs,
  createdAt: simulationRuns.createdAt,
  createdByName: users.name,
};

export async function listRuns({ scenarioId, limit = 20 }: { scenarioId: string; limit?: number }) {
  return getDb()
    .select(listColumns)
    .from(simulationRuns)
    .leftJoin(users, eq(users.id, simulationRuns.createdById))
    .where(planRunsOf(scenarioId))
    .orderBy(desc(simulationRuns.createdAt))
    .limit(limit);
}

export async function getRun({ id }: { id: string }) {
  const [row] = await getDb()
    .select({ ...listColumns, results: simulationRuns.results })
    .from(simulationRuns)
    .leftJoin(users, eq(users.id, simulationRuns.createdById))
    .where(eq(simulationRuns.id, id));
  return row ?? null;
}

export async function getLatestRun({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({ ...listColumns, results: simulationRuns.results })
    .from(simulationRuns)
    .leftJoin(users, eq(users.id, simulationRuns.createdById))
    .where(planRunsOf(scenarioId))
    .orderBy(desc(simulationRuns.createdAt))
    .limit(1);
  return row ?? null;
}
