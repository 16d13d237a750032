/**
 * An invitation to a project archived since it was sent: the invite page says so before anyone joins (a member of
 * an archived project reads and exports everything, changes nothing), and says nothing of the kind otherwise.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { randomBytes } from "node:crypto";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { hashShareToken } from "@/lib/server/share-token";

let db: postgres.Sql;
let projectId: string;
const token = randomBytes(32).toString("base64url");

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["admin"]);
  projectId = team.projectId;
  await db`INSERT INTO invitations (project_id, email, role, token_hash, invited_by, expires_at)
    VALUES (${projectId}, ${`invited-${Date.now()}@marrin-dot.example`}, 'viewer', ${hashShareToken(token)}, ${team.members[0].id}, now() + interval '1 day')`;
});
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

const page = async () => {
  const res = await call(`/invite/${token}`);
  expect(res.status).toBe(200);
  return String(res.body);
};

describe("an invitation to an archived project", () => {
  it("says the project is archived, and only when it is", async () => {
    expect(await page()).not.toContain('data-testid="invite-archived"');
    await db`UPDATE projects SET archived_at = now() WHERE id = ${projectId}`;
    const html = await page();
    expect(html).toContain('data-testid="invite-archived"');
    expect(html).toContain("This project was archived: once you join you can read and export everything in it");
  });
});
