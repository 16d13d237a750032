import "server-only";
/**
 * The daily re-forecast of a project's plan of record: its setting, the projects the server's pass looks at, the
 * once-a-day claim (so two app processes never queue the same day twice) and what the day's look decided.
 */
import { and, desc, eq, isNotNull, isNull, lt, or, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb } from "../client";
import { projectMembers, projects, scenarios, simulationRuns, users } from "../schema";
import { reforecastsOf, shiftsNotInRun } from "./progress";
import { olderRulesSql, runIsStale } from "./stale";

/** Turns it on at `hour` (0–23, local), set up by `userId`, or off (`hour` null). Null when there is no such project. */
export async function setDailyReforecast({ projectId, hour, userId }: { projectId: string; hour: number | null; userId: string }) {
  const [row] = await getDb()
    .update(projects)
    .set(hour === null ? { dailyReforecastHour: null } : { dailyReforecastHour: hour, dailyReforecastById: userId })
    .where(eq(projects.id, projectId))
    .returning({ hour: projects.dailyReforecastHour });
  return row ?? null;
}

/** The setting as the project page shows it: the hour, who set it up, and the last day's decision. */
export async function getDailyReforecast({ projectId }: { projectId: string }) {
  const [row] = await getDb()
    .select({ hour: projects.dailyReforecastHour, byName: users.name, lastOn: projects.dailyReforecastLastOn, note: projects.dailyReforecastNote })
    .from(projects)
    .leftJoin(users, eq(users.id, projects.dailyReforecastById))
    .where(eq(projects.id, projectId));
  return row ?? null;
}

/**
 * Projects in use with the daily re-forecast on and a plan of record: the plan and its time zone, the hour, the last
 * day looked at, and who set it up with their role on the project now (null: no longer a member, or their account is
 * gone).
 */
export async function listDailyReforecastPlans() {
  const setter = alias(projectMembers, "setter");
  return getDb()
    .select({
      projectId: projects.id,
      hour: projects.dailyReforecastHour,
      lastOn: projects.dailyReforecastLastOn,
      userId: projects.dailyReforecastById,
      role: setter.role,
      scenarioId: scenarios.id,
      // Enough of the plan to tell whether its day has come, without reading the whole definition every minute.
      timeZone: sql<string | null>`${scenarios.definition} ->> 'timeZone'`,
    })
    .from(projects)
    .innerJoin(scenarios, eq(scenarios.id, projects.planScenarioId))
    .leftJoin(setter, and(eq(setter.projectId, projects.id), eq(setter.userId, projects.dailyReforecastById)))
    .where(and(isNotNull(projects.dailyReforecastHour), isNull(projects.archivedAt)));
}

/** Marks `day` (local) as looked at, only if it was not: true for the one caller that goes on to decide. */
export async function claimDailyReforecastDay({ projectId, day }: { projectId: string; day: string }) {
  const rows = await getDb()
    .update(projects)
    .set({ dailyReforecastLastOn: day })
    .where(and(eq(projects.id, projectId), or(isNull(projects.dailyReforecastLastOn), lt(projects.dailyReforecastLastOn, day))))
    .returning({ id: projects.id });
  return rows.length === 1;
}

/** Hands a claimed day back (the queue could not be reached), so a later pass tries it again. */
export async function releaseDailyReforecastDay({ projectId, day, previous }: { projectId: string; day: string; previous: string | null }) {
  await getDb()
    .update(projects)
    .set({ dailyReforecastLastOn: previous })
    .where(and(eq(projects.id, projectId), eq(projects.dailyReforecastLastOn, day)));
}

export async function setDailyReforecastNote({ projectId, note }: { projectId: string; note: string }) {
  await getDb().update(projects).set({ dailyReforecastNote: note }).where(eq(projects.id, projectId));
}

/** The newest re-forecast of a scenario as the daily decision reads it (src/lib/daily-reforecast.ts). */
export async function getNewestReforecastBasis({ scenarioId }: { scenarioId: string }) {
  const [row] = await getDb()
    .select({
      dataDate: sql<string>`${simulationRuns.dataDate}`,
      stale: runIsStale(),
      olderRules: olderRulesSql(),
      seed: simulationRuns.seed,
      iterations: simulationRuns.iterations,
      changes: shiftsNotInRun,
    })
    .from(simulationRuns)
    .where(reforecastsOf(scenarioId))
    .orderBy(desc(simulationRuns.createdAt), desc(simulationRuns.id))
    .limit(1);
  return row ?? null;
}
