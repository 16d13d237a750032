/**
 * Migrations and seed against a real PostgreSQL database of their own (TEST_DATABASE_URL, set by `npm test`).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { runMigrations } from "../../db/migrate";
import { seed, DEMO_SCENARIO_FILES } from "../../scripts/seed";
import { readFileSync } from "node:fs";
import { parseScenario } from "../../sim/validate";
import { upgradeScenario } from "../../sim/upgrade";

const url = process.env.TEST_DATABASE_URL;
if (!url) throw new Error("TEST_DATABASE_URL is not set: run through `npm test`.");
const sql = postgres(url, { max: 1, onnotice: () => {} });

async function counts() {
  const [row] = await sql`SELECT
    (SELECT count(*)::int FROM users) AS users,
    (SELECT count(*)::int FROM projects) AS projects,
    (SELECT count(*)::int FROM project_members) AS members,
    (SELECT count(*)::int FROM scenarios) AS scenarios,
    (SELECT count(*)::int FROM simulation_runs) AS runs,
    (SELECT count(*)::int FROM simulation_runs WHERE data_date IS NOT NULL) AS reforecasts,
    (SELECT count(*)::int FROM progress_entries) AS entries`;
  return row;
}

beforeAll(async () => {
  // Start from an empty database every time.
  await sql.unsafe("DROP SCHEMA IF EXISTS public CASCADE; DROP SCHEMA IF EXISTS drizzle CASCADE; CREATE SCHEMA public;");
});
afterAll(async () => {
  await sql.end();
});

describe("migrations", () => {
  it("apply to an empty database and create every table", async () => {
    await runMigrations(url);
    const tables = await sql`SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`;
    expect(tables.map((t) => t.table_name)).toEqual(
      expect.arrayContaining([
        "users",
        "sessions",
        "projects",
        "project_members",
        "scenarios",
        "scenario_revisions",
        "simulation_runs",
        "share_links",
        "uploads",
        "progress_entries",
        "progress_history",
        "email_outbox",
        "sign_in_attempts",
        "engine_jobs",
        "engine_workers",
        "engine_leases",
        "plan_searches",
        "plan_search_variants",
      ]),
    );
    // The engine job queue's own tables and its queue (pg-boss), installed by the same step.
    const queues = await sql`SELECT name FROM pgboss.queue`;
    expect(queues.map((q) => q.name)).toContain("engine");
    // Owned by the role the app connects as (not a superuser), so the web server and the workers may use it.
    const [owner] = await sql`SELECT pg_get_userbyid(n.nspowner) AS schema_owner, current_user AS me, (SELECT rolsuper FROM pg_roles WHERE rolname = current_user) AS superuser,
      (SELECT count(*)::int FROM pg_class c WHERE c.relnamespace = n.oid AND c.relkind IN ('r', 'p') AND pg_get_userbyid(c.relowner) <> current_user) AS foreign_tables
      FROM pg_namespace n WHERE n.nspname = 'pgboss'`;
    expect(owner).toMatchObject({ schema_owner: owner.me, superuser: false, foreign_tables: 0 });
  });

  it("are idempotent: applying them again changes nothing", async () => {
    const before = await sql`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`;
    await runMigrations(url);
    const after = await sql`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`;
    expect(after[0].n).toBe(before[0].n);
    expect(before[0].n).toBeGreaterThan(0);
  });
});

describe("seed", () => {
  it("fills an empty database with every role, three projects and the demo scenarios with runs", async () => {
    // The clock is pinned: seeded on 2 December 2026, the demo's first season (2026) is over, the second ahead.
    expect(await seed(url, { now: new Date("2026-12-02T18:00:00Z") })).toBe("seeded");
    const c = await counts();
    expect(c.users).toBe(5);
    expect(c.projects).toBe(3); // the causeway under way, the staged south approach for next season, Tern Point
    expect(c.scenarios).toBe(DEMO_SCENARIO_FILES.length + 1); // + the staged south-approach plan
    expect(c.scenarios).toBeGreaterThanOrEqual(3);
    expect(c.reforecasts).toBeGreaterThanOrEqual(3);
    expect(c.runs).toBe(DEMO_SCENARIO_FILES.length + 1 + c.reforecasts);
    expect(c.entries).toBeGreaterThan(100);
    const [span] = await sql`SELECT min(work_date)::text AS first, max(work_date)::text AS last FROM progress_entries`;
    expect(span.first >= "2026-04-06" && span.last < "2026-12-02").toBe(true);
    const starts = await sql`SELECT DISTINCT definition->>'startDate' AS d FROM scenarios ORDER BY 1`;
    // The causeway began this spring; the staged south approach is planned 52 weeks later.
    expect(starts.map((r) => r.d)).toEqual(["2026-04-06", "2027-04-05"]);
    const [late] = await sql`SELECT count(*)::int AS n FROM simulation_runs WHERE data_date >= '2026-12-02'`;
    expect(late.n).toBe(0);
    // The newest re-forecast knows the whole seeded log: every shift worked by its data date and recorded (and last
    // changed) before it was run — so the demo's plan of record is not said to be behind the field.
    const [behind] = await sql`
      SELECT count(*)::int AS n FROM progress_entries pe,
        (SELECT data_date, created_at FROM simulation_runs WHERE data_date IS NOT NULL ORDER BY created_at DESC LIMIT 1) r
      WHERE pe.work_date > r.data_date OR pe.updated_at > r.created_at`;
    expect(behind.n).toBe(0);
    const roles = await sql`SELECT DISTINCT role::text FROM project_members ORDER BY 1`;
    expect(roles.map((r) => r.role)).toEqual(["admin", "engineer", "inspector", "scheduler", "viewer"]);
  });

  it("is idempotent and keeps what users saved", async () => {
    await sql`UPDATE scenarios SET name = 'Edited by a user' WHERE id = (SELECT id FROM scenarios LIMIT 1)`;
    const before = await counts();
    expect(await seed(url)).toBe("skipped");
    expect(await counts()).toEqual(before);
    const edited = await sql`SELECT count(*)::int AS n FROM scenarios WHERE name = 'Edited by a user'`;
    expect(edited[0].n).toBe(1);
  });

  it("stores passwords only as argon2id hashes", async () => {
    const rows = await sql`SELECT password_hash FROM users`;
    for (const r of rows) expect(r.password_hash).toMatch(/^\$argon2id\$/);
  });
});

describe("migration 0005: stored scenarios upgraded to version 2", () => {
  const v1 = JSON.parse(readFileSync(new URL("../fixtures/saved-v1-kestrel-two-season.json", import.meta.url), "utf8"));
  const updates = readFileSync(new URL("../../db/migrations/0005_upgrade-scenarios-v2.sql", import.meta.url), "utf8")
    .split("--> statement-breakpoint")
    .map((x) => x.trim())
    .filter((x) => x.startsWith("UPDATE"));

  it("rewrites a saved version-1 definition and its revisions as upgradeScenario does, loses nothing and leaves version 2 alone", async () => {
    const [row] = await sql`SELECT id, definition FROM scenarios ORDER BY name LIMIT 1`;
    const current = row.definition;
    await sql`UPDATE scenarios SET definition = ${sql.json(v1)} WHERE id = ${row.id}`;
    await sql`UPDATE scenario_revisions SET definition = ${sql.json(v1)} WHERE scenario_id = ${row.id}`;
    expect(updates).toHaveLength(2);
    for (const u of updates) await sql.unsafe(u);
    const [after] = await sql`SELECT definition FROM scenarios WHERE id = ${row.id}`;
    expect(after.definition).toEqual(upgradeScenario(v1));
    expect(parseScenario(after.definition).ok).toBe(true);
    const revisions = await sql`SELECT definition FROM scenario_revisions WHERE scenario_id = ${row.id}`;
    for (const r of revisions) expect(r.definition).toEqual(upgradeScenario(v1));
    // A version-2 row is untouched by a second pass.
    await sql`UPDATE scenarios SET definition = ${sql.json(current)} WHERE id = ${row.id}`;
    for (const u of updates) await sql.unsafe(u);
    const [again] = await sql`SELECT definition FROM scenarios WHERE id = ${row.id}`;
    expect(again.definition).toEqual(current);
  });
});
