/**
 * A project of its own for tests that count things per person or per project (quotas, admins, sessions):
 * written straight into the app's database, so nothing another test does can change the counts.
 */
import postgres from "postgres";
import { randomUUID } from "node:crypto";
import { hashPassword } from "../../src/lib/server/password";
import { call, signIn } from "./app";

export type TeamRole = "admin" | "engineer" | "scheduler" | "inspector" | "viewer";
export const FRESH_PASSWORD = "a-test-password-987";

export function appDatabase() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: run through `npm test`.");
  return postgres(url, { max: 2, onnotice: () => {} });
}

export async function freshUser(db: postgres.Sql, label: string) {
  const id = randomUUID();
  const email = `${label}.${id.slice(0, 8)}@hardening.example`;
  await db`INSERT INTO users (id, email, name, password_hash) VALUES (${id}, ${email}, ${`Test ${label}`}, ${await hashPassword(FRESH_PASSWORD)})`;
  return { id, email, cookie: () => signIn(email, FRESH_PASSWORD) };
}

/** A new project with one member per listed role (e.g. ["admin", "engineer"]). */
export async function freshTeam(db: postgres.Sql, roles: TeamRole[]) {
  const [project] = await db`INSERT INTO projects (name, structure_name, deck_length_ft, start_station_ft, lanes)
    VALUES (${`Hardening test ${randomUUID().slice(0, 8)}`}, 'Test structure', 8400, 1200, ${db.json(["L1", "L2", "L3"])}) RETURNING id`;
  const members = [];
  for (const role of roles) {
    const u = await freshUser(db, role);
    await db`INSERT INTO project_members (project_id, user_id, role) VALUES (${project.id}, ${u.id}, ${role})`;
    members.push({ ...u, role });
  }
  return { projectId: project.id as string, members };
}

/** A scenario on the project, made through the API from the seeded demo definition. */
export async function freshScenario(cookie: string, projectId: string, definition: Record<string, unknown>, name = "Hardening scenario") {
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name, definition: { ...definition, name } } });
  if (res.status !== 201) throw new Error(`scenario create failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: string; version: number };
}
