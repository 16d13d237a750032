import "server-only";
/**
 * The weekly closure e-mail of a project: its setting, the projects the server's pass looks at (with the publication
 * that stands for each — what every feed and advisory of the project shows), the once-a-day claim and the day's note.
 */
import { and, eq, isNotNull, isNull, lt, or, sql } from "drizzle-orm";
import { getDb } from "../client";
import { closurePublications, projects, scenarioRevisions, scenarios, shareLinks, simulationRuns } from "../schema";
import type { Executor } from "./mail";
import { newestPublicationFirst, publicationStands } from "./published-plans";

/** Turns it on (`day` 0–6 from Sunday and `hour` 0–23, local) or off (both null). Null when there is no such project. */
export async function setClosureWeekly({ projectId, day, hour }: { projectId: string; day: number | null; hour: number | null }) {
  const [row] = await getDb()
    .update(projects)
    .set({ closureWeeklyDay: day, closureWeeklyHour: hour })
    .where(eq(projects.id, projectId))
    .returning({ day: projects.closureWeeklyDay, hour: projects.closureWeeklyHour });
  return row ?? null;
}

/** The setting as the Share page shows it, with the last day's note. */
export async function getClosureWeekly({ projectId }: { projectId: string }) {
  const [row] = await getDb()
    .select({ day: projects.closureWeeklyDay, hour: projects.closureWeeklyHour, lastOn: projects.closureWeeklyLastOn, note: projects.closureWeeklyNote })
    .from(projects)
    .where(eq(projects.id, projectId));
  return row ?? null;
}

/**
 * Projects in use with the weekly e-mail on, each with its newest publication still standing (`publicationStands`) and
 * that plan's time zone — enough to tell whether its day has come without reading any run. A project with nothing
 * published is listed with nulls: there is nothing to send.
 */
export async function listClosureWeeklyProjects() {
  const standing = getDb()
    .select({
      publicationId: sql<string>`${closurePublications.id}`.as("standing_id"),
      timeZone: sql<string | null>`${scenarioRevisions.definition} ->> 'timeZone'`.as("standing_time_zone"),
    })
    .from(closurePublications)
    .innerJoin(shareLinks, eq(shareLinks.id, closurePublications.shareLinkId))
    .innerJoin(scenarios, eq(scenarios.id, closurePublications.scenarioId))
    .innerJoin(simulationRuns, eq(simulationRuns.id, closurePublications.runId))
    .innerJoin(scenarioRevisions, and(eq(scenarioRevisions.scenarioId, simulationRuns.scenarioId), eq(scenarioRevisions.version, simulationRuns.scenarioVersion)))
    .where(and(eq(scenarios.projectId, projects.id), publicationStands))
    .orderBy(...newestPublicationFirst)
    .limit(1)
    .as("standing");
  return getDb()
    .select({
      projectId: projects.id,
      projectName: projects.name,
      day: projects.closureWeeklyDay,
      hour: projects.closureWeeklyHour,
      lastOn: projects.closureWeeklyLastOn,
      publicationId: standing.publicationId,
      timeZone: standing.timeZone,
    })
    .from(projects)
    .leftJoinLateral(standing, sql`true`)
    .where(and(isNotNull(projects.closureWeeklyDay), isNull(projects.archivedAt)));
}

/** Marks `day` (local) as done, only if it was not: true for the one caller (of several server processes) that sends. */
export async function claimClosureWeeklyDay({ tx, projectId, day, note }: { tx: Executor; projectId: string; day: string; note: string }) {
  const rows = await tx
    .update(projects)
    .set({ closureWeeklyLastOn: day, closureWeeklyNote: note })
    .where(and(eq(projects.id, projectId), or(isNull(projects.closureWeeklyLastOn), lt(projects.closureWeeklyLastOn, day))))
    .returning({ id: projects.id });
  return rows.length === 1;
}
