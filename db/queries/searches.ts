import "server-only";
/** Plan searches and their variants' outcomes. */
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { getDb } from "../client";
import { engineJobs, planSearches, planSearchVariants, scenarios, users } from "../schema";
import type { SearchSpec } from "../../sim/search";
import type { PlanOutcome } from "../../sim/frontier";
import type { ProgressRecord } from "../../sim/asbuilt";
import { olderRulesSql, staleSql } from "./stale";
import { MODEL_REVISION } from "../../sim/model-revision";

export interface NewSearch {
  projectId: string;
  scenarioId: string;
  scenarioVersion: number;
  name: string;
  spec: SearchSpec;
  method: "grid" | "sample";
  gridSize: number;
  /** A search from the field log: its shifts as they stand now (`planSearches.fieldLog`). */
  fieldLog?: ProgressRecord[] | null;
  userId: string;
  variants: { idx: number; choice: number[] | null; label: string; bossJobId: string }[];
}

/** The search and all its variant rows, in one transaction: a search is never stored half-built. */
export async function createSearch(input: NewSearch) {
  return getDb().transaction(async (tx) => {
    const [search] = await tx
      .insert(planSearches)
      .values({ projectId: input.projectId, scenarioId: input.scenarioId, scenarioVersion: input.scenarioVersion, name: input.name, spec: input.spec, method: input.method, gridSize: input.gridSize, fieldLog: input.fieldLog ?? null, modelRevision: MODEL_REVISION, createdById: input.userId })
      .returning();
    await tx.insert(planSearchVariants).values(input.variants.map((v) => ({ ...v, searchId: search.id })));
    return search;
  });
}

export async function getSearch({ id }: { id: string }) {
  const [row] = await getDb()
    .select({
      id: planSearches.id,
      projectId: planSearches.projectId,
      scenarioId: planSearches.scenarioId,
      scenarioVersion: planSearches.scenarioVersion,
      stale: staleSql(planSearches.scenarioVersion, scenarios.version),
      olderRules: olderRulesSql(planSearches.modelRevision),
      scenarioName: scenarios.name,
      name: planSearches.name,
      spec: planSearches.spec,
      method: planSearches.method,
      gridSize: planSearches.gridSize,
      /** How many shifts a search from the field log started from (null for a search from the plan's start). */
      fieldLogShifts: sql<number | null>`jsonb_array_length(${planSearches.fieldLog})`,
      createdAt: planSearches.createdAt,
      createdByName: users.name,
      jobId: engineJobs.id,
      jobStatus: engineJobs.status,
    })
    .from(planSearches)
    .innerJoin(scenarios, eq(scenarios.id, planSearches.scenarioId))
    .innerJoin(users, eq(users.id, planSearches.createdById))
    .leftJoin(engineJobs, eq(engineJobs.searchId, planSearches.id))
    .where(eq(planSearches.id, id));
  return row ?? null;
}
export type SearchDetail = NonNullable<Awaited<ReturnType<typeof getSearch>>>;

/** The field log a search from the field log started from (the worker's read; null for one from the plan's start). */
export async function getSearchFieldLog({ id }: { id: string }): Promise<ProgressRecord[] | null> {
  const [row] = await getDb().select({ fieldLog: planSearches.fieldLog }).from(planSearches).where(eq(planSearches.id, id));
  return row?.fieldLog ?? null;
}

export async function listVariants({ searchId }: { searchId: string }) {
  return getDb()
    .select({ idx: planSearchVariants.idx, choice: planSearchVariants.choice, label: planSearchVariants.label, status: planSearchVariants.status, outcome: planSearchVariants.outcome, problem: planSearchVariants.problem })
    .from(planSearchVariants)
    .where(eq(planSearchVariants.searchId, searchId))
    .orderBy(asc(planSearchVariants.idx));
}

export async function listSearches({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({
      id: planSearches.id,
      name: planSearches.name,
      method: planSearches.method,
      scenarioVersion: planSearches.scenarioVersion,
      createdAt: planSearches.createdAt,
      createdByName: users.name,
      jobStatus: engineJobs.status,
      variants: sql<number>`(select count(*)::int from ${planSearchVariants} v where v.search_id = ${planSearches.id})`,
    })
    .from(planSearches)
    .innerJoin(users, eq(users.id, planSearches.createdById))
    .leftJoin(engineJobs, eq(engineJobs.searchId, planSearches.id))
    .where(eq(planSearches.scenarioId, scenarioId))
    .orderBy(desc(planSearches.createdAt), desc(planSearches.id));
}

export async function getVariant({ searchId, idx }: { searchId: string; idx: number }) {
  const [row] = await getDb()
    .select()
    .from(planSearchVariants)
    .where(and(eq(planSearchVariants.searchId, searchId), eq(planSearchVariants.idx, idx)));
  return row ?? null;
}

/** Stores a variant's outcome once (a retried variant finds it done and changes nothing). */
export async function saveVariantOutcome(input: { searchId: string; idx: number; status: "done" | "infeasible" | "failed"; outcome: PlanOutcome | null; problem: string | null }) {
  const [row] = await getDb()
    .update(planSearchVariants)
    .set({ status: input.status, outcome: input.outcome, problem: input.problem, finishedAt: new Date() })
    .where(and(eq(planSearchVariants.searchId, input.searchId), eq(planSearchVariants.idx, input.idx), eq(planSearchVariants.status, "pending")))
    .returning({ idx: planSearchVariants.idx });
  return !!row;
}

export async function variantProgress({ searchId }: { searchId: string }) {
  const [row] = await getDb()
    .select({ total: sql<number>`count(*)::int`, finished: sql<number>`count(*) filter (where ${planSearchVariants.status} <> 'pending')::int` })
    .from(planSearchVariants)
    .where(eq(planSearchVariants.searchId, searchId));
  return row;
}

export async function pendingVariantJobIds({ searchId }: { searchId: string }) {
  const rows = await getDb()
    .select({ bossJobId: planSearchVariants.bossJobId })
    .from(planSearchVariants)
    .where(and(eq(planSearchVariants.searchId, searchId), eq(planSearchVariants.status, "pending")));
  return rows.map((r) => r.bossJobId);
}
