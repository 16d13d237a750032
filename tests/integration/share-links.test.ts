/** Share links: read-only for anyone with the token, gone at once when revoked or expired. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { formatIsoDate } from "../../src/lib/format";

// The app's own database, to age a link past its expiry without waiting.
const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
let scheduler: string;
let scenarioId: string;
let projectId: string;

beforeAll(async () => {
  scheduler = await signInAs("scheduler");
  projectId = (await kestrelProject(scheduler)).id;
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
  scenarioId = list.body.scenarios.find((s: { runId: string | null }) => s.runId).id;
});
afterAll(async () => {
  await appDb.end();
});

async function newLink(days = 7) {
  const res = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: days, label: "test" } });
  expect(res.status).toBe(201);
  return res.body as { id: string; token: string; path: string };
}

describe("share links", () => {
  it("the token is at least 128 bits, returned once and stored only as a hash", async () => {
    const link = await newLink();
    expect(Buffer.from(link.token, "base64url").length * 8).toBeGreaterThanOrEqual(128);
    const rows = await appDb`SELECT token_hash FROM share_links WHERE id = ${link.id}`;
    expect(rows[0].token_hash).not.toContain(link.token);
    expect(rows[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    const listed = await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: scheduler });
    expect(JSON.stringify(listed.body)).not.toContain(link.token);
  });

  it("shows the scenario inputs and latest run without a session", async () => {
    const link = await newLink();
    const res = await call(`/api/shared/${link.token}`);
    expect(res.status).toBe(200);
    expect(res.body.scenario.definition.operations.length).toBeGreaterThan(0);
    expect(res.body.run.results.finish.p80).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    // Nothing about other scenarios or members leaks.
    expect(JSON.stringify(res.body)).not.toMatch(/password|email/i);
  });

  it("tells the link's reader when the field log has moved the plan run on, without a link into the app", async () => {
    // The seeded plan of record has re-forecasts newer than its plan run; a scenario never re-forecast has none.
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
    const rows = list.body.scenarios as { id: string; name: string; reforecastP80: string | null; runId: string | null }[];
    const moved = rows.find((r) => r.name === "Kestrel Bay Causeway — two seasons")!;
    const still = rows.find((r) => r.runId && !r.reforecastP80)!;
    const linkTo = async (id: string) => (await call(`/api/scenarios/${id}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 7, label: "reader" } })).body as { token: string };

    const movedLink = await linkTo(moved.id);
    const api = await call(`/api/shared/${movedLink.token}`);
    expect(api.body.reforecast.summary.finish.p80).toBe(moved.reforecastP80);
    const page = await call(`/shared/${movedLink.token}`);
    expect(page.status).toBe(200);
    const html = String(page.body);
    expect(html).toContain("The field log has moved this forecast on.");
    expect(html).toContain(`P80 finish <strong>${formatIsoDate(moved.reforecastP80!)}</strong>`);
    expect(html).not.toContain(`/scenarios/${moved.id}/progress`);
    // What follows is called the plan run, not the forecast.
    expect(html).toMatch(/<h2[^>]*>Plan run<\/h2>/);

    const stillPage = await call(`/shared/${(await linkTo(still.id)).token}`);
    expect(stillPage.status).toBe(200);
    expect(String(stillPage.body)).not.toContain("The field log has moved this forecast on.");
    expect(String(stillPage.body)).toMatch(/<h2[^>]*>Forecast<\/h2>/);
  });

  it("a revoked link is 404 at once", async () => {
    const link = await newLink();
    expect((await call(`/api/share-links/${link.id}`, { method: "DELETE", cookie: scheduler })).status).toBe(200);
    expect((await call(`/api/shared/${link.token}`)).status).toBe(404);
    expect((await call(link.path)).status).toBe(404);
  });

  it("an expired link is 404", async () => {
    const link = await newLink();
    await appDb`UPDATE share_links SET expires_at = now() - interval '1 minute' WHERE id = ${link.id}`;
    expect((await call(`/api/shared/${link.token}`)).status).toBe(404);
  });

  it("an unknown token is 404", async () => {
    expect((await call(`/api/shared/${"x".repeat(43)}`)).status).toBe(404);
  });

  it("expiry outside 1–365 days is 400 naming the field", async () => {
    const res = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 0 } });
    expect(res.status).toBe(400);
    expect(res.body.fields[0].path).toBe("expiresInDays");
  });

  it("a visitor holding only the token cannot write anything (every write route tried)", async () => {
    const link = await newLink();
    const writes: [string, string, unknown][] = [
      ["POST", `/api/projects/${projectId}/scenarios`, { name: "x", definition: {} }],
      ["PUT", `/api/scenarios/${scenarioId}`, { name: "x", definition: {}, version: 1 }],
      ["DELETE", `/api/scenarios/${scenarioId}`, undefined],
      ["POST", `/api/scenarios/${scenarioId}/variants`, { name: "x" }],
      ["POST", `/api/scenarios/${scenarioId}/runs`, { seed: "x", iterations: 10 }],
      ["POST", `/api/scenarios/${scenarioId}/share-links`, { expiresInDays: 3 }],
      ["DELETE", `/api/share-links/${link.id}`, undefined],
      ["POST", `/api/projects/${projectId}/members`, { email: "a@b.example", role: "admin" }],
      ["POST", `/api/shared/${link.token}`, {}],
      ["PUT", `/api/shared/${link.token}`, {}],
      ["DELETE", `/api/shared/${link.token}`, undefined],
    ];
    for (const [method, path, body] of writes) {
      const res = await call(`${path}${path.includes("?") ? "&" : "?"}token=${link.token}`, { method, body });
      expect([401, 405], `${method} ${path} gave ${res.status}`).toContain(res.status);
    }
    // The link and the scenario are untouched.
    expect((await call(`/api/shared/${link.token}`)).status).toBe(200);
    expect((await call(`/api/scenarios/${scenarioId}`, { cookie: scheduler })).status).toBe(200);
  });
});
