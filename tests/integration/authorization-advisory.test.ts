/**
 * Beyond the matrix rows (tests/helpers/authz-api-rows.ts, authorization-pages.test.ts): publishing refuses a
 * run other than the previewed one; a publication's token opens its advisory page and calendar feed without
 * sign-in and nothing else (not the shared scenario page or JSON); an ordinary share link opens no advisory;
 * revoking the publication's link closes both at once.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { serverRunDone } from "../helpers/jobs";
import { forgetRecentMail } from "../helpers/mail-quota";

let projectId: string;
let base: Record<string, unknown>;

async function scenarioWithRun(label: string): Promise<string> {
  const admin = await signInAs("admin");
  const s = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: admin, body: { name: label, definition: { ...base, name: label } } });
  if (s.status !== 201) throw new Error(`fixture scenario failed: ${s.status}`);
  const job = await serverRunDone(s.body.id, admin, { seed: "advisory", iterations: 10 });
  if (job.status !== "completed") throw new Error(`fixture run ${job.status}: ${job.error}`);
  return s.body.id;
}

const tokenOf = (url: string) => new URL(url).pathname.split("/").filter(Boolean).at(-1)!;

beforeAll(async () => {
  const admin = await signInAs("admin");
  projectId = (await kestrelProject(admin)).id;
  base = await demoDefinition(admin, projectId);
  await forgetRecentMail(projectId);
}, 120_000);

describe("publishing names the previewed run", { timeout: 120_000 }, () => {
  it("a publication naming another run than the latest is refused and nothing is published", async () => {
    const admin = await signInAs("admin");
    const id = await scenarioWithRun("stale preview");
    const before = (await call(`/api/scenarios/${id}/closure-publications`, { cookie: admin })).body.publications.length;
    const res = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: "00000000-0000-4000-8000-000000000000" } });
    expect(res.status).toBe(409);
    const bad = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: "not-an-id" } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].path).toBe("runId");
    expect((await call(`/api/scenarios/${id}/closure-publications`, { cookie: admin })).body.publications.length).toBe(before);
  });

  it("a plan run again after the preview is refused with the previewed run's id, and the new preview publishes", async () => {
    const admin = await signInAs("admin");
    const id = await scenarioWithRun("re-run after preview");
    const first = (await call(`/api/scenarios/${id}/closure-publications?preview=1`, { cookie: admin })).body.preview;
    expect((await serverRunDone(id, admin, { seed: "advisory again", iterations: 10 })).status).toBe("completed");
    const stale = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: first.runId } });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatch(/run again or re-forecast after your preview/);
    const second = (await call(`/api/scenarios/${id}/closure-publications?preview=1`, { cookie: admin })).body.preview;
    expect(second.runId).not.toBe(first.runId);
    expect((await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: second.runId } })).status).toBe(201);
  });
});

describe("the public travel advisory: no sign-in, scoped to one published plan", { timeout: 120_000 }, () => {
  let published: { advisoryUrl: string; feedUrl: string };
  let scenarioShareToken: string;
  let scenarioId: string;

  beforeAll(async () => {
    const admin = await signInAs("admin");
    scenarioId = await scenarioWithRun("advisory scope");
    const res = await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: admin });
    expect(res.status).toBe(201);
    published = res.body;
    const share = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: admin, body: { expiresInDays: 7 } });
    expect(share.status).toBe(201);
    scenarioShareToken = share.body.token;
  }, 120_000);

  it("the advisory and its calendar feed open signed out", async () => {
    const token = tokenOf(published.advisoryUrl);
    const page = await call(`/advisory/${token}`);
    expect(page.status).toBe(200);
    expect(String(page.body)).toContain("lane closures and expected delays");
    const feed = await call(`/api/shared/${token}/closures.ics`);
    expect(feed.status).toBe(200);
    // iCalendar folds long lines (RFC 5545 §3.1): unfold before looking for the advisory link.
    expect(String(feed.body).replace(/\r\n[ \t]/g, "")).toContain(`/advisory/${token}`);
  });

  it("the publication's token opens nothing else: not the shared scenario page or its JSON", async () => {
    const token = tokenOf(published.advisoryUrl);
    expect((await call(`/api/shared/${token}`)).status).toBe(404);
    expect((await call(`/shared/${token}`)).status).toBe(404);
  });

  it("an ordinary share link opens no advisory; an unknown token neither", async () => {
    expect((await call(`/advisory/${scenarioShareToken}`)).status).toBe(404);
    expect((await call(`/advisory/${"x".repeat(43)}`)).status).toBe(404);
    expect((await call(`/advisory/short`)).status).toBe(404);
  });

  it("revoking the publication's link closes the advisory and the feed at once", async () => {
    const admin = await signInAs("admin");
    const again = await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: admin });
    expect(again.status, JSON.stringify(again.body).slice(0, 300)).toBe(201);
    const token = tokenOf(again.body.advisoryUrl);
    expect((await call(`/advisory/${token}`)).status).toBe(200);
    const links = (await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: admin })).body.links as { id: string; revokedAt: string | null; createdAt: string }[];
    const newest = links.filter((l) => !l.revokedAt).sort((a, b) => b.createdAt.localeCompare(a.createdAt))[0];
    expect((await call(`/api/share-links/${newest.id}`, { method: "DELETE", cookie: admin })).status).toBe(200);
    expect((await call(`/advisory/${token}`)).status).toBe(404);
    expect((await call(`/api/shared/${token}/closures.ics`)).status).toBe(404);
  });
});
