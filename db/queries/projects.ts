import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb } from "../client";
import { projectMembers, projects, users, type Role } from "../schema";

export async function listProjectsForUser({ userId }: { userId: string }) {
  return getDb()
    .select({
      id: projects.id,
      name: projects.name,
      structureName: projects.structureName,
      region: projects.region,
      deckLengthFt: projects.deckLengthFt,
      startStationFt: projects.startStationFt,
      lanes: projects.lanes,
      role: projectMembers.role,
    })
    .from(projectMembers)
    .innerJoin(projects, eq(projects.id, projectMembers.projectId))
    .where(eq(projectMembers.userId, userId))
    .orderBy(asc(projects.name));
}

export async function getProject({ id }: { id: string }) {
  const [row] = await getDb().select().from(projects).where(eq(projects.id, id));
  return row ?? null;
}

export async function getMembershipRole({ projectId, userId }: { projectId: string; userId: string }): Promise<Role | null> {
  const [row] = await getDb()
    .select({ role: projectMembers.role })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  return row?.role ?? null;
}

export async function listMembers({ projectId }: { projectId: string }) {
  return getDb()
    .select({ userId: users.id, email: users.email, name: users.name, title: users.title, role: projectMembers.role, addedAt: projectMembers.addedAt })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, projectId))
    .orderBy(asc(users.name));
}

export async function upsertMember({ projectId, userId, role }: { projectId: string; userId: string; role: Role }) {
  await getDb()
    .insert(projectMembers)
    .values({ projectId, userId, role })
    .onConflictDoUpdate({ target: [projectMembers.projectId, projectMembers.userId], set: { role } });
}

export async function removeMember({ projectId, userId }: { projectId: string; userId: string }) {
  const rows = await getDb()
    .delete(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)))
    .returning({ userId: projectMembers.userId });
  return rows.length > 0;
}

export async function countAdmins({ projectId }: { projectId: string }) {
  const rows = await getDb()
    .select({ userId: projectMembers.userId })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.role, "admin")));
  return rows.length;
}
