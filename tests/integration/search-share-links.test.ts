/**
 * Plan searches shared by link: a read-only link to one search opens that search's JSON and page without a
 * session and nothing else — not its scenario, not the scenario's feed or advisory, not another search; a
 * scenario link opens no search; revoking or expiring the link closes it at once; the database refuses a
 * search link without its search. (The role × route cells are in the authorization matrix.)
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { SMALL_SEARCH, must, newSearch, newSearchLink, newShareLink, uniq } from "../helpers/authz-world";
import { waitForJob } from "../helpers/jobs";
import { forgetRecentMail } from "../helpers/mail-quota";

const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
let engineer: string;
let projectId: string;
let scenarioId: string;
let searchId: string;
let otherSearchId: string;

beforeAll(async () => {
  engineer = await signInAs("engineer");
  projectId = (await kestrelProject(engineer)).id;
  await forgetRecentMail(projectId);
  const base = await demoDefinition(engineer, projectId);
  const name = uniq("search sharing");
  scenarioId = must(await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: engineer, body: { name, definition: { ...base, name } } }), 201, "scenario").id;
  searchId = await newSearch(scenarioId, engineer);
  otherSearchId = must(
    await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie: engineer, body: { name: "The other search", spec: { ...SMALL_SEARCH, seed: "other" } } }),
    202,
    "second search",
  ).search.id;
  const job = must(await call(`/api/searches/${searchId}`, { cookie: engineer }), 200, "search").search.jobId as string;
  expect((await waitForJob(job, engineer, { timeoutMs: 180_000 })).status).toBe("completed");
}, 240_000);
afterAll(async () => {
  await appDb.end();
});

describe("a link to one plan search", { timeout: 60_000 }, () => {
  it("opens that search's plans without a session, and nothing that leads elsewhere", async () => {
    const link = await newSearchLink(searchId, engineer);
    expect(link.path).toBe(`/shared-search/${link.token}`);
    expect(Buffer.from(link.token, "base64url").length * 8).toBeGreaterThanOrEqual(128);
    const res = await call(`/api/shared-search/${link.token}`, { cookie: null });
    expect(res.status).toBe(200);
    const signedIn = must(await call(`/api/searches/${searchId}`, { cookie: engineer }), 200, "search");
    expect(res.body.search.name).toBe(signedIn.search.name);
    // The same plans with the same frontier marks as the signed-in page.
    expect(res.body.variants.map((v: { idx: number; onFrontier: boolean; status: string }) => [v.idx, v.onFrontier, v.status])).toEqual(
      signedIn.variants.map((v: { idx: number; onFrontier: boolean; status: string }) => [v.idx, v.onFrontier, v.status]),
    );
    expect(res.body.variants.filter((v: { status: string }) => v.status === "done").length).toBe(signedIn.variants.length);
    // No id to follow: not the job (to cancel), the scenario, the project or a variant's choice (to save).
    const text = JSON.stringify(res.body);
    for (const id of [signedIn.search.jobId, scenarioId, projectId, otherSearchId]) expect(text).not.toContain(id);
    expect(res.body.variants[1]).not.toHaveProperty("choice");
    expect(text).not.toMatch(/password|email/i);
    const page = await call(link.path, { cookie: null });
    expect(page.status).toBe(200);
    expect(String(page.body)).toContain("Plan search on");
    expect(String(page.body)).not.toContain("Save as scenario");
  });

  it("opens no scenario, feed, advisory or other search; a scenario link opens no search", async () => {
    const link = await newSearchLink(searchId, engineer);
    for (const path of [`/api/shared/${link.token}`, `/shared/${link.token}`, `/api/shared/${link.token}/closures.ics`, `/advisory/${link.token}`]) {
      expect((await call(path, { cookie: null })).status, path).toBe(404);
    }
    // Presented as a session or a bearer token it is no session: the signed-in search routes refuse it.
    for (const id of [searchId, otherSearchId]) {
      const res = await call(`/api/searches/${id}`, { cookie: `pourline_session=${link.token}`, headers: { authorization: `Bearer ${link.token}` } });
      expect(res.status).toBe(401);
    }
    const scenarioLink = await newShareLink(scenarioId, engineer);
    expect((await call(`/api/shared/${scenarioLink.token}`, { cookie: null })).status).toBe(200);
    expect((await call(`/api/shared-search/${scenarioLink.token}`, { cookie: null })).status).toBe(404);
    expect((await call(`/shared-search/${scenarioLink.token}`, { cookie: null })).status).toBe(404);
    // The second search has its own link; each token shows only its own search.
    const other = await newSearchLink(otherSearchId, engineer);
    expect((await call(`/api/shared-search/${other.token}`, { cookie: null })).body.search.name).toBe("The other search");
    expect((await call(`/api/shared-search/${link.token}`, { cookie: null })).body.search.name).not.toBe("The other search");
  });

  it("is listed with the search and with its scenario, and revoking it closes the JSON and the page at once", async () => {
    const label = uniq("revoke me");
    const link = must(await call(`/api/searches/${searchId}/share-links`, { method: "POST", cookie: engineer, body: { expiresInDays: 3, label } }), 201, "link");
    const bySearch = must(await call(`/api/searches/${searchId}/share-links`, { cookie: engineer }), 200, "search links").links;
    expect(bySearch.find((l: { label: string }) => l.label === label)).toMatchObject({ scope: "search", searchId, revokedAt: null });
    expect(JSON.stringify(bySearch)).not.toContain(link.token);
    // The other search's list does not hold it.
    const byOther = must(await call(`/api/searches/${otherSearchId}/share-links`, { cookie: engineer }), 200, "other links").links;
    expect(byOther.some((l: { label: string }) => l.label === label)).toBe(false);
    const byScenario = must(await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: engineer }), 200, "scenario links").links;
    expect(byScenario.find((l: { label: string }) => l.label === label)).toMatchObject({ scope: "search", searchName: expect.any(String) });

    expect((await call(`/api/shared-search/${link.token}`, { cookie: null })).status).toBe(200);
    expect((await call(`/api/share-links/${link.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    expect((await call(`/api/shared-search/${link.token}`, { cookie: null })).status).toBe(404);
    const page = await call(link.path, { cookie: null });
    expect(page.status).toBe(404);
    expect(String(page.body)).toContain("This link is not available");
  });

  it("an expired link is 404", async () => {
    const link = await newSearchLink(searchId, engineer);
    await appDb`UPDATE share_links SET expires_at = now() - interval '1 minute' WHERE id = ${link.id}`;
    expect((await call(`/api/shared-search/${link.token}`, { cookie: null })).status).toBe(404);
  });

  it("input limits: label and expiry are checked and named, and a malformed search id is 404", async () => {
    const bad = await call(`/api/searches/${searchId}/share-links`, { method: "POST", cookie: engineer, body: { expiresInDays: 400, label: "x".repeat(121), emailTo: ["not an address"] } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { path: string }) => f.path).sort()).toEqual(["emailTo[0]", "expiresInDays", "label"]);
    expect(bad.body.fields.find((f: { path: string }) => f.path === "expiresInDays").message).toBe("must be at most 365 days");
    expect((await call(`/api/searches/not-a-uuid/share-links`, { method: "POST", cookie: engineer, body: { expiresInDays: 1 } })).status).toBe(404);
    expect((await call(`/api/shared-search/${"x".repeat(500)}`, { cookie: null })).status).toBe(404);
  });

  it("e-mails the link when asked, in the same transaction as the link", async () => {
    const to = `${uniq("pio")}@marrin-county.example`;
    const res = await call(`/api/searches/${searchId}/share-links`, { method: "POST", cookie: engineer, body: { expiresInDays: 7, label: "county", emailTo: [to] } });
    expect(res.status).toBe(201);
    expect(res.body.emailedTo).toEqual([to]);
    const [mail] = await appDb`SELECT subject, text_body FROM email_outbox WHERE to_address = ${to}`;
    expect(mail.subject).toMatch(/^Plan search shared with you: /);
    expect(mail.text_body).toContain(`/shared-search/${res.body.token}`);
  });

  it("the database keeps a search link tied to its search, and no other link to one", async () => {
    const [link] = await appDb`SELECT id, created_by, token_hash FROM share_links WHERE search_id = ${searchId} LIMIT 1`;
    const insert = (scope: string, search: string | null) =>
      appDb`INSERT INTO share_links (scope, scenario_id, search_id, token_hash, created_by, expires_at)
        VALUES (${scope}::share_scope, ${scenarioId}, ${search}, ${`${link.token_hash}-${scope}-${search ?? "none"}`}, ${link.created_by}, now() + interval '1 day')`;
    await expect(insert("search", null)).rejects.toThrow(/share_links_search_scope/);
    await expect(insert("scenario", searchId)).rejects.toThrow(/share_links_search_scope/);
  });
});
