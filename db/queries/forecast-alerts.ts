import "server-only";
/** Who asked for an e-mail with each new forecast of a project's plan of record (project_members.forecast_alerts). */
import { and, eq } from "drizzle-orm";
import { getDb } from "../client";
import { projectMembers, users } from "../schema";

type Reader = Pick<ReturnType<typeof getDb>, "select">;

/** Turns the member's forecast e-mails on or off; false when the person is not a member of the project. */
export async function setForecastAlerts({ projectId, userId, enabled }: { projectId: string; userId: string; enabled: boolean }): Promise<boolean> {
  const rows = await getDb()
    .update(projectMembers)
    .set({ forecastAlerts: enabled })
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)))
    .returning({ userId: projectMembers.userId });
  return rows.length === 1;
}

export async function getForecastAlerts({ projectId, userId }: { projectId: string; userId: string }): Promise<boolean> {
  const [row] = await getDb()
    .select({ on: projectMembers.forecastAlerts })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  return row?.on ?? false;
}

/**
 * The project's members who asked for forecast e-mails, by address: whom the e-mail goes to (read in the sending
 * transaction) and whom the Members page names.
 */
export async function forecastAlertReaders({ tx = getDb(), projectId }: { tx?: Reader; projectId: string }): Promise<{ email: string; name: string }[]> {
  return tx
    .select({ email: users.email, name: users.name })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.forecastAlerts, true)))
    .orderBy(users.email);
}
