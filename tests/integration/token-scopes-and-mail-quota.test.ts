/**
 * A calendar-feed token opens the feed and nothing else; a scenario share link opens the page, its JSON and
 * the feed. Outgoing e-mail has a quota per person and per project, enforced under concurrency.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { appDatabase, freshScenario, freshTeam } from "../helpers/fresh-team";
import { serverRunDone } from "../helpers/jobs";

const db = appDatabase();
let definition: Record<string, unknown>;
beforeAll(async () => {
  const admin = await signInAs("admin");
  definition = await demoDefinition(admin, (await kestrelProject(admin)).id);
});
afterAll(() => db.end());

describe("token scopes", () => {
  it("the closure-feed token opens the feed only; the scenario token opens page, JSON and feed", async () => {
    const { projectId, members } = await freshTeam(db, ["engineer"]);
    const cookie = await members[0].cookie();
    const scenario = await freshScenario(cookie, projectId, definition, "Scope test");
    expect((await serverRunDone(scenario.id, cookie, { seed: "scope", iterations: 10 })).status).toBe("completed");
    const published = await call(`/api/scenarios/${scenario.id}/closure-publications`, { method: "POST", cookie });
    expect(published.status).toBe(201);
    const feedToken = new URL(published.body.feedUrl).pathname.split("/")[3];
    const [feedRow] = await db`SELECT s.scope FROM share_links s JOIN closure_publications p ON p.share_link_id = s.id WHERE p.scenario_id = ${scenario.id}`;
    expect(feedRow.scope).toBe("closure-feed");

    expect((await call(`/api/shared/${feedToken}/closures.ics`)).status).toBe(200);
    expect((await call(`/api/shared/${feedToken}`)).status).toBe(404);
    expect((await call(`/shared/${feedToken}`)).status).toBe(404);

    const link = await call(`/api/scenarios/${scenario.id}/share-links`, { method: "POST", cookie, body: { label: "scope", expiresInDays: 7, emailTo: [] } });
    expect(link.status).toBe(201);
    expect(link.body.scope).toBe("scenario");
    expect((await call(`/api/shared/${link.body.token}`)).status).toBe(200);
    expect((await call(`/shared/${link.body.token}`)).status).toBe(200);
    expect((await call(`/api/shared/${link.body.token}/closures.ics`)).status).toBe(200);
  });
});

describe("e-mail quota", () => {
  const addresses = (n: number) => Array.from({ length: n }, (_, i) => `quota.${randomUUID().slice(0, 6)}.${i}@partner.example`);

  it("20 parallel share-link requests with 10 addresses each: 5 go out (50 e-mails), 15 are refused naming the quota", async () => {
    const { projectId, members } = await freshTeam(db, ["scheduler"]);
    const [sender] = members;
    const cookie = await sender.cookie();
    const scenario = await freshScenario(cookie, projectId, definition, "Quota test");
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, i) => call(`/api/scenarios/${scenario.id}/share-links`, { method: "POST", cookie, body: { label: `burst ${i}`, expiresInDays: 7, emailTo: addresses(10) } })),
    );
    expect(results.filter((r) => r.status === 201)).toHaveLength(5);
    const refused = results.filter((r) => r.status === 429);
    expect(refused).toHaveLength(15);
    expect(refused[0].body.error).toMatch(/50 e-mails per hour/);
    expect(refused[0].body.quota).toBe("per-user-per-hour");
    expect((await db`SELECT count(*)::int AS n FROM email_outbox WHERE requested_by = ${sender.id}`)[0].n).toBe(50);
    // A refused request wrote nothing: no link without its e-mails.
    expect((await db`SELECT count(*)::int AS n FROM share_links WHERE scenario_id = ${scenario.id}`)[0].n).toBe(5);
    await db`DELETE FROM email_outbox WHERE requested_by = ${sender.id} AND status = 'pending'`;
  });

  it("a project's quota counts all its members together", async () => {
    const { projectId, members } = await freshTeam(db, ["engineer", "scheduler"]);
    const [earlier, sender] = members;
    // 195 e-mails this project's engineer sent in the last hour (already delivered, so the poller leaves them).
    await db`INSERT INTO email_outbox (to_address, subject, text_body, status, requested_by, project_id, sent_at)
      SELECT 'earlier.' || g || '@partner.example', 'earlier', 'x', 'sent', ${earlier.id}, ${projectId}, now() FROM generate_series(1, 195) g`;
    const cookie = await sender.cookie();
    const scenario = await freshScenario(cookie, projectId, definition, "Project quota");
    const res = await call(`/api/scenarios/${scenario.id}/share-links`, { method: "POST", cookie, body: { label: "over", expiresInDays: 7, emailTo: addresses(10) } });
    expect(res.status).toBe(429);
    expect(res.body.error).toMatch(/project may send 200 e-mails per hour/);
    const ok = await call(`/api/scenarios/${scenario.id}/share-links`, { method: "POST", cookie, body: { label: "fits", expiresInDays: 7, emailTo: addresses(5) } });
    expect(ok.status).toBe(201);
    await db`DELETE FROM email_outbox WHERE project_id = ${projectId}`;
  });
});
