import "server-only";
/**
 * The daily look-ahead e-mail of each scenario. `claimNoticeDay` marks a notice sent for a local date only
 * if it was not already, inside the caller's transaction, so two app processes never send the same day twice.
 */
import { and, asc, eq, isNull, lt, or } from "drizzle-orm";
import { getDb } from "../client";
import { lookAheadNotices, projects, scenarios } from "../schema";
import type { Executor } from "./mail";

export async function getLookAheadNotice({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({ enabled: lookAheadNotices.enabled, hour: lookAheadNotices.hour, recipients: lookAheadNotices.recipients, lastSentOn: lookAheadNotices.lastSentOn, updatedAt: lookAheadNotices.updatedAt })
    .from(lookAheadNotices)
    .where(eq(lookAheadNotices.scenarioId, scenarioId));
  return row ?? null;
}

export async function saveLookAheadNotice(input: { scenarioId: string; enabled: boolean; hour: number; recipients: string[]; userId: string }) {
  const values = { enabled: input.enabled, hour: input.hour, recipients: input.recipients, updatedById: input.userId, updatedAt: new Date() };
  await getDb()
    .insert(lookAheadNotices)
    .values({ scenarioId: input.scenarioId, ...values })
    .onConflictDoUpdate({ target: lookAheadNotices.scenarioId, set: values });
}

/** Every look-ahead notice set up on a project's scenarios, on or off, for the project's overview of its e-mail. */
export async function listProjectLookAheadNotices({ projectId }: { projectId: string }) {
  return getDb()
    .select({
      scenarioId: lookAheadNotices.scenarioId,
      name: scenarios.name,
      enabled: lookAheadNotices.enabled,
      hour: lookAheadNotices.hour,
      recipients: lookAheadNotices.recipients,
      lastSentOn: lookAheadNotices.lastSentOn,
    })
    .from(lookAheadNotices)
    .innerJoin(scenarios, eq(scenarios.id, lookAheadNotices.scenarioId))
    .where(eq(scenarios.projectId, projectId))
    .orderBy(asc(scenarios.name));
}

/** Enabled notices with what the sender needs of their scenario; none of an archived project (it is a record, not a job in hand). */
export async function listEnabledNotices() {
  return getDb()
    .select({
      scenarioId: lookAheadNotices.scenarioId,
      hour: lookAheadNotices.hour,
      recipients: lookAheadNotices.recipients,
      lastSentOn: lookAheadNotices.lastSentOn,
      lastBoard: lookAheadNotices.lastBoard,
      projectId: scenarios.projectId,
      name: scenarios.name,
      definition: scenarios.definition,
    })
    .from(lookAheadNotices)
    .innerJoin(scenarios, eq(scenarios.id, lookAheadNotices.scenarioId))
    .innerJoin(projects, eq(projects.id, scenarios.projectId))
    .where(and(eq(lookAheadNotices.enabled, true), isNull(projects.archivedAt)));
}

export async function claimNoticeDay({ tx, scenarioId, date, board }: { tx: Executor; scenarioId: string; date: string; board: Record<string, unknown> }): Promise<boolean> {
  const rows = await tx
    .update(lookAheadNotices)
    .set({ lastSentOn: date, lastBoard: board })
    .where(and(eq(lookAheadNotices.scenarioId, scenarioId), or(isNull(lookAheadNotices.lastSentOn), lt(lookAheadNotices.lastSentOn, date))))
    .returning({ id: lookAheadNotices.scenarioId });
  return rows.length > 0;
}
