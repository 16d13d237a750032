/**
 * Archiving a project: only its administrators archive and restore it; archived, it answers every read and refuses
 * every change with 409 and one sentence — except what the archive allows (members, restoring) and what takes
 * something away (revoking a share link, removing a subscriber, cancelling a run), which must never be stopped.
 * The sweep runs every write row of the API matrix (tests/helpers/authz-api-rows.ts) as the Kestrel administrator
 * on an archived copy of the Kestrel project (the browser tests, which run beside this file, write to Kestrel
 * itself), each prepared while the project is in use, and checks nothing was destroyed by
 * a refused call. The daily e-mail of an archived project's scenarios is not sent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { discoverApiRouteMethods, fillPath } from "../helpers/route-inventory";
import { API_ROWS } from "../helpers/authz-api-rows";
import { buildWorld, must, type World } from "../helpers/authz-world";
import { ARCHIVED_REFUSAL, ARCHIVED_STILL_ALLOWS } from "@/lib/permissions";
import { listEnabledNotices } from "../../db/queries/look-ahead-notices";

/** Routes that take something away: allowed in an archive (src/lib/server/access.ts, intent "takeAway"). */
const TAKE_AWAY = ["DELETE /api/share-links/[linkId]", "DELETE /api/projects/[projectId]/closure-subscribers/[subscriberId]", "DELETE /api/jobs/[jobId]"];
const ARCHIVE_ROUTE = "PUT /api/projects/[projectId]/archive";

let w: World;
const archive = () => w.db`UPDATE projects SET archived_at = now() WHERE id = ${w.projectId}`;
const restore = () => w.db`UPDATE projects SET archived_at = NULL, archived_by_id = NULL WHERE id = ${w.projectId}`;

beforeAll(async () => {
  w = await buildWorld({ ownCopy: true });
}, 120_000);
afterAll(async () => {
  // Whatever happened above, the project is left in use.
  if (w) {
    await restore();
    await w.db.end();
  }
});

const discovered = discoverApiRouteMethods();
const projectRows = Object.entries(API_ROWS).filter(([key, row]) => discovered.includes(key) && key !== ARCHIVE_ROUTE && (row.need.kind === "project" || row.need.kind === "scenario"));
const reads = projectRows.filter(([key]) => key.startsWith("GET "));
const writes = projectRows.filter(([key]) => !key.startsWith("GET "));

describe("archiving and restoring", () => {
  it("only an administrator archives; an engineer is refused and nothing changes", async () => {
    const refused = await call(`/api/projects/${w.projectId}/archive`, { method: "PUT", cookie: w.cookies.engineer, body: { archived: true } });
    expect(refused.status).toBe(403);
    const [row] = await w.db`SELECT archived_at FROM projects WHERE id = ${w.projectId}`;
    expect(row.archived_at).toBeNull();
  });

  it("a body that is not true or false is refused, naming the field", async () => {
    const bad = await call(`/api/projects/${w.projectId}/archive`, { method: "PUT", cookie: w.cookies.admin, body: { archived: "yes" } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { path: string }) => f.path)).toEqual(["archived"]);
  });

  it("archives with who and when, keeps the first date on a second archive, lists it as archived, and restores", async () => {
    try {
      const first = must(await call(`/api/projects/${w.projectId}/archive`, { method: "PUT", cookie: w.cookies.admin, body: { archived: true } }), 200, "archive");
      expect(first.archived).toBe(true);
      const again = must(await call(`/api/projects/${w.projectId}/archive`, { method: "PUT", cookie: w.cookies.admin, body: { archived: true } }), 200, "archive again");
      expect(again.archivedAt).toBe(first.archivedAt);
      const [row] = await w.db`SELECT p.archived_at, u.email FROM projects p JOIN users u ON u.id = p.archived_by_id WHERE p.id = ${w.projectId}`;
      expect(row.email).toMatch(/^admin@/);
      const listed = must(await call("/api/projects", { cookie: w.cookies.viewer }), 200, "projects").projects.find((p: { id: string }) => p.id === w.projectId);
      expect(listed.archivedAt).toBe(first.archivedAt);

      // Archived: a change is refused with the sentence, and nothing is saved.
      const name = `archived ${Date.now()}`;
      const refused = await call(`/api/projects/${w.projectId}/scenarios`, { method: "POST", cookie: w.cookies.scheduler, body: { name, definition: { ...w.base, name } } });
      expect(refused.status).toBe(409);
      expect(refused.body.error).toBe(ARCHIVED_REFUSAL);
      expect((await w.db`SELECT count(*)::int AS n FROM scenarios WHERE name = ${name}`)[0].n).toBe(0);
      // The plan editor is told, so it opens read-only.
      expect(must(await call(`/api/scenarios/${w.target.id}`, { cookie: w.cookies.scheduler }), 200, "scenario").archived).toBe(true);

      const back = must(await call(`/api/projects/${w.projectId}/archive`, { method: "PUT", cookie: w.cookies.admin, body: { archived: false } }), 200, "restore");
      expect(back).toMatchObject({ archived: false, archivedAt: null });
      const created = await call(`/api/projects/${w.projectId}/scenarios`, { method: "POST", cookie: w.cookies.scheduler, body: { name, definition: { ...w.base, name } } });
      expect(created.status).toBe(201);
    } finally {
      await restore();
    }
  });

  it("an archived project's daily e-mails are not among those the sender sends", async () => {
    await w.db`
      INSERT INTO look_ahead_notices (scenario_id, enabled, hour, recipients, last_sent_on, updated_by)
      SELECT ${w.target.id}, false, 6, ${w.db.json(["archive-test@marrin-dot.example"])}, '2999-01-01', u.id FROM users u WHERE u.email LIKE 'admin@%' LIMIT 1
      ON CONFLICT (scenario_id) DO UPDATE SET enabled = false, last_sent_on = '2999-01-01'`;
    try {
      await archive();
      // "Sent" far in the future, so the app's own sender never finds it due while this test looks.
      await w.db`UPDATE look_ahead_notices SET enabled = true WHERE scenario_id = ${w.target.id}`;
      expect((await listEnabledNotices()).map((n) => n.scenarioId)).not.toContain(w.target.id);
      await w.db`UPDATE look_ahead_notices SET enabled = false WHERE scenario_id = ${w.target.id}`;
      await restore();
      await w.db`UPDATE look_ahead_notices SET enabled = true WHERE scenario_id = ${w.target.id}`;
      const inUse = (await listEnabledNotices()).map((n) => n.scenarioId);
      await w.db`UPDATE look_ahead_notices SET enabled = false WHERE scenario_id = ${w.target.id}`;
      expect(inUse).toContain(w.target.id);
    } finally {
      await w.db`DELETE FROM look_ahead_notices WHERE scenario_id = ${w.target.id}`;
      await restore();
    }
  });
});

describe("every row of the API matrix on an archived project, as its administrator", () => {
  it("the sweep has rows of both kinds", () => {
    expect(reads.length).toBeGreaterThan(10);
    expect(writes.length).toBeGreaterThan(20);
  });

  it.each(reads.map(([key]) => key))("%s answers as in use", async (key) => {
    const [method, template] = key.split(" ");
    await restore();
    const prep = await API_ROWS[key].request(w, "admin");
    await archive();
    const res = await call(fillPath(template, prep.params) + (prep.query ? `?${prep.query}` : ""), { method, cookie: w.cookies.admin });
    expect(res.status, `${key}: ${JSON.stringify(res.body)?.slice(0, 200)}`).toBe(API_ROWS[key].ok);
  });

  it.each(writes.map(([key]) => key))("%s", async (key) => {
    const row = API_ROWS[key];
    const [method, template] = key.split(" ");
    const action = row.need.kind === "project" || row.need.kind === "scenario" ? row.need.action : "read";
    const allowed = ARCHIVED_STILL_ALLOWS.includes(action) || TAKE_AWAY.includes(key);
    await restore();
    const prep = await row.request(w, "admin");
    await archive();
    const res = await call(fillPath(template, prep.params) + (prep.query ? `?${prep.query}` : ""), { method, body: prep.body, cookie: w.cookies.admin });
    const where = `${key}: ${res.status} ${JSON.stringify(res.body)?.slice(0, 200)}`;
    if (allowed) {
      expect(res.status, where).toBe(row.ok);
    } else {
      expect(res.status, where).toBe(409);
      expect(res.body.error, where).toBe(ARCHIVED_REFUSAL);
      if (prep.survives) expect(await prep.survives(), `${key}: the refused call destroyed nothing`).toBe(true);
    }
  });
});
