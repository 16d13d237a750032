import "server-only";
import { and, asc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb, prepared } from "../client";
import { projectMembers, projects, scenarios, simulationRuns, users, type Role } from "../schema";
import { forecastOrder, isForecast } from "./runs";
import { shiftsNotInRun } from "./progress";
import { olderRulesSql, staleSql } from "./stale";

/**
 * The headline of a project's plan of record, as columns to select beside the project: the plan's name and its
 * forecast — its newest re-forecast from the field log, else its newest plan run (runs.ts `forecastOrder`) — with whether the plan
 * changed after it, how many field-log changes it does not know, and the forecast before that one. The caller left-joins `plan` on projects.plan_scenario_id, and
 * `planRun` and `previousRun` laterally.
 */
function planOfRecordParts(db: ReturnType<typeof getDb>) {
  const plan = alias(scenarios, "plan");
  const planRun = db
    .select({
      id: sql<string>`${simulationRuns.id}`.as("plan_run_id"),
      summary: sql<Record<string, unknown>>`${simulationRuns.summary}`.as("plan_run_summary"),
      at: sql<Date>`${simulationRuns.createdAt}`.mapWith(simulationRuns.createdAt).as("plan_run_at"),
      dataDate: sql<string | null>`${simulationRuns.dataDate}`.as("plan_run_data_date"),
      version: sql<number>`${simulationRuns.scenarioVersion}`.as("plan_run_version"),
      shiftsNotIn: sql<number>`${shiftsNotInRun}`.as("plan_run_shifts_not_in"),
      olderRules: sql<boolean>`${olderRulesSql()}`.as("plan_run_older_rules"),
    })
    .from(simulationRuns)
    .where(and(eq(simulationRuns.scenarioId, projects.planScenarioId), isForecast))
    .orderBy(...forecastOrder)
    .limit(1)
    .as("plan_run");
  // The forecast before it, in the same order: how far the finish moved since.
  const previousRun = db
    .select({ summary: sql<Record<string, unknown>>`${simulationRuns.summary}`.as("previous_run_summary") })
    .from(simulationRuns)
    .where(and(eq(simulationRuns.scenarioId, projects.planScenarioId), isForecast))
    .orderBy(...forecastOrder)
    .limit(1)
    .offset(1)
    .as("previous_run");
  const columns = {
    planScenarioId: projects.planScenarioId,
    planRunId: planRun.id,
    planName: plan.name,
    planRunSummary: planRun.summary,
    planRunAt: planRun.at,
    planRunDataDate: planRun.dataDate,
    planRunStale: sql<boolean | null>`${staleSql(planRun.version, plan.version)}`,
    /** Field-log changes the newest forecast does not know (progress.ts `shiftsNotInRun`). */
    planRunShiftsNotIn: planRun.shiftsNotIn,
    /** Computed under an earlier revision of the model rules (stale.ts `olderRulesSql`). */
    planRunOlderRules: planRun.olderRules,
    previousRunSummary: previousRun.summary,
  };
  return { plan, planRun, previousRun, columns };
}

/** The projects a person belongs to, with their role and the headline of each one's plan of record. */
export async function listProjectsForUser({ userId }: { userId: string }) {
  const db = getDb();
  const { plan, planRun, previousRun, columns } = planOfRecordParts(db);
  return db
    .select({
      id: projects.id,
      name: projects.name,
      structureName: projects.structureName,
      region: projects.region,
      deckLengthFt: projects.deckLengthFt,
      startStationFt: projects.startStationFt,
      lanes: projects.lanes,
      archivedAt: projects.archivedAt,
      role: projectMembers.role,
      ...columns,
    })
    .from(projectMembers)
    .innerJoin(projects, eq(projects.id, projectMembers.projectId))
    .leftJoin(plan, eq(plan.id, projects.planScenarioId))
    .leftJoinLateral(planRun, sql`true`)
    .leftJoinLateral(previousRun, sql`true`)
    .where(eq(projectMembers.userId, userId))
    .orderBy(asc(projects.name));
}

/**
 * Plans of record whose newest forecast has not been announced yet, on projects in use, with the headline the
 * e-mail says (planOfRecordParts), whether the plan itself changed since, and the announced run it replaces (for
 * the claim).
 */
export async function listUnannouncedPlanForecasts() {
  const db = getDb();
  const { plan, planRun, previousRun, columns } = planOfRecordParts(db);
  return db
    .select({
      projectId: projects.id,
      projectName: projects.name,
      announcedRunId: projects.planAnnouncedRunId,
      // Another scenario's (or none): the plan of record itself changed since the last e-mail.
      planChanged: sql<boolean>`${projects.planScenarioId} is distinct from (select ${simulationRuns.scenarioId} from ${simulationRuns} where ${simulationRuns.id} = ${projects.planAnnouncedRunId})`,
      newestRunId: planRun.id,
      ...columns,
    })
    .from(projects)
    .innerJoin(plan, eq(plan.id, projects.planScenarioId))
    .leftJoinLateral(planRun, sql`true`)
    .leftJoinLateral(previousRun, sql`true`)
    .where(and(isNull(projects.archivedAt), isNotNull(planRun.id), sql`${planRun.id} is distinct from ${projects.planAnnouncedRunId}`));
}

/**
 * Moves the project's announced forecast from `from` to `to`, only if nobody did meanwhile: true for the one
 * caller (of several server processes) that gets to send the e-mails, inside its transaction.
 */
export async function claimPlanAnnouncement({ tx, projectId, from, to }: { tx: Pick<ReturnType<typeof getDb>, "update">; projectId: string; from: string | null; to: string }) {
  const rows = await tx
    .update(projects)
    .set({ planAnnouncedRunId: to })
    .where(and(eq(projects.id, projectId), sql`${projects.planAnnouncedRunId} is not distinct from ${from}::uuid`))
    .returning({ id: projects.id });
  return rows.length === 1;
}

/** One project's plan-of-record headline (see planOfRecordParts); null when there is no such project. */
export async function getPlanOfRecord({ projectId }: { projectId: string }) {
  const db = getDb();
  const { plan, planRun, previousRun, columns } = planOfRecordParts(db);
  const [row] = await db
    .select(columns)
    .from(projects)
    .leftJoin(plan, eq(plan.id, projects.planScenarioId))
    .leftJoinLateral(planRun, sql`true`)
    .leftJoinLateral(previousRun, sql`true`)
    .where(eq(projects.id, projectId));
  return row ?? null;
}

/** A project's own fields as stored (the request contract's output, src/lib/schemas.ts `projectDetailsSchema`). */
export interface ProjectFields {
  name: string;
  structureName: string;
  region: string;
  deckLengthFt: number;
  startStationFt: number;
  lanes: string[];
  description: string;
}

/**
 * A new project and its creator as its administrator, in one transaction: a project without an administrator
 * could never get members, so neither row is written without the other.
 */
export async function createProject({ userId, project }: { userId: string; project: ProjectFields }): Promise<{ id: string }> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx.insert(projects).values(project).returning({ id: projects.id });
    await tx.insert(projectMembers).values({ projectId: row.id, userId, role: "admin" });
    return row;
  });
}

/**
 * New details for a project. Its scenarios keep the deck they were saved with; the project's deck is where new
 * scenarios start (the standard template). Null when there is no such project.
 */
export async function updateProject({ projectId, project }: { projectId: string; project: ProjectFields }): Promise<{ id: string } | null> {
  const [row] = await getDb().update(projects).set(project).where(eq(projects.id, projectId)).returning({ id: projects.id });
  return row ?? null;
}

/**
 * Makes `scenarioId` the project's plan of record (null: none). Only a scenario of this project can be chosen;
 * "no_scenario" when it is not one (nothing changes), "no_project" when the project is gone.
 */
export async function setPlanOfRecord({ projectId, scenarioId }: { projectId: string; scenarioId: string | null }): Promise<"ok" | "no_scenario" | "no_project"> {
  const db = getDb();
  const own = scenarioId === null ? sql`true` : sql`exists (select 1 from ${scenarios} where ${scenarios.id} = ${scenarioId} and ${scenarios.projectId} = ${projectId})`;
  // The announced forecast stays the old plan's: the forecast e-mails then tell their readers of the new plan.
  const [row] = await db.update(projects).set({ planScenarioId: scenarioId }).where(and(eq(projects.id, projectId), own)).returning({ id: projects.id });
  if (row) return "ok";
  return (await getProject({ id: projectId })) ? "no_scenario" : "no_project";
}

/**
 * Archives the project (`archived`) or restores it, recording who and when; archiving an archived project keeps
 * the first date and name. Null when there is no such project.
 */
export async function setProjectArchived({ projectId, userId, archived }: { projectId: string; userId: string; archived: boolean }) {
  const db = getDb();
  const set = archived ? { archivedAt: sql`coalesce(${projects.archivedAt}, now())`, archivedById: sql`case when ${projects.archivedAt} is null then ${userId} else ${projects.archivedById} end` } : { archivedAt: null, archivedById: null };
  const [row] = await db.update(projects).set(set).where(eq(projects.id, projectId)).returning({ id: projects.id, archivedAt: projects.archivedAt });
  return row ?? null;
}

/** Who archived the project, by name (null when it is not archived or the person's account is gone). */
export async function archivedByName({ projectId }: { projectId: string }): Promise<string | null> {
  const [row] = await getDb().select({ name: users.name }).from(projects).innerJoin(users, eq(users.id, projects.archivedById)).where(eq(projects.id, projectId));
  return row?.name ?? null;
}

export async function getProject({ id }: { id: string }) {
  const [row] = await getDb().select().from(projects).where(eq(projects.id, id));
  return row ?? null;
}

/** The project and the person's role in it (null = not a member) in one query; null when there is no such project. */
export async function getProjectWithRole({ projectId, userId }: { projectId: string; userId: string }) {
  // Prepared: every request to a project's routes asks this first (db/client.ts `prepared`).
  const [row] = await prepared("project_with_role", (db) =>
    db
      .select({ project: projects, role: projectMembers.role })
      .from(projects)
      .leftJoin(projectMembers, and(eq(projectMembers.projectId, projects.id), eq(projectMembers.userId, sql.placeholder("userId"))))
      .where(eq(projects.id, sql.placeholder("projectId")))
      .prepare("project_with_role"),
  ).execute({ projectId, userId });
  return row ?? null;
}

export async function listMembers({ projectId }: { projectId: string }) {
  return getDb()
    .select({ userId: users.id, email: users.email, name: users.name, title: users.title, role: projectMembers.role, addedAt: projectMembers.addedAt })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, projectId))
    .orderBy(asc(users.name));
}

export type MembershipChange = { ok: true } | { ok: false; reason: "not_member" | "last_admin" };

/**
 * The one way a role changes: `role` sets (adding the person if needed), `null` removes. In one transaction
 * that first locks the project row, so concurrent changes to the same project's members run one after the
 * other; a change that would leave the project without an administrator is refused ("last_admin") and
 * nothing is written.
 */
export async function changeMembership({ projectId, userId, role }: { projectId: string; userId: string; role: Role | null }): Promise<MembershipChange> {
  return getDb().transaction(async (tx) => {
    await tx.select({ id: projects.id }).from(projects).where(eq(projects.id, projectId)).for("update");
    const members = await tx.select({ userId: projectMembers.userId, role: projectMembers.role }).from(projectMembers).where(eq(projectMembers.projectId, projectId));
    const current = members.find((m) => m.userId === userId)?.role ?? null;
    if (role === null && current === null) return { ok: false, reason: "not_member" };
    const adminsAfter = members.filter((m) => m.role === "admin" && m.userId !== userId).length + (role === "admin" ? 1 : 0);
    if (adminsAfter === 0 && members.some((m) => m.role === "admin")) return { ok: false, reason: "last_admin" };
    if (role === null) {
      await tx.delete(projectMembers).where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
    } else {
      await tx
        .insert(projectMembers)
        .values({ projectId, userId, role })
        .onConflictDoUpdate({ target: [projectMembers.projectId, projectMembers.userId], set: { role } });
    }
    return { ok: true };
  });
}
