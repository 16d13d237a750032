/**
 * Authorization rows for the closure publication preview, publishing with a previewed run, and the public
 * travel advisory: the preview and publish need the share permission (non-members get 404, signed out 401);
 * a publication's token opens its advisory page and calendar feed without sign-in and nothing else (not the
 * shared scenario page or JSON); an ordinary share link opens no advisory; a revoked or unknown token opens
 * nothing. (Kept beside authorization.test.ts; on a branch with the route-discovering matrix these rows move there.)
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, demoDefinition, demoEmail, kestrelProject, signIn, signInAs, type DemoRole } from "../helpers/app";

type Who = DemoRole | "signedOut" | "nonMember";
const EVERYONE: Who[] = ["signedOut", "nonMember", "viewer", "inspector", "scheduler", "engineer", "admin"];
const editors = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: ok, engineer: ok, admin: ok });

const cookieOf: Partial<Record<Who, string | null>> = {};
let projectId: string;
let ternProjectId: string;
let base: Record<string, unknown>;

async function scenarioWithRun(who: Who, label: string): Promise<string> {
  const admin = await signInAs("admin");
  // The scheduler is not a member of the seeded Tern Point project: "nonMember" is the scheduler there.
  const project = who === "nonMember" ? ternProjectId : projectId;
  const s = await call(`/api/projects/${project}/scenarios`, { method: "POST", cookie: admin, body: { name: label, definition: { ...base, name: label } } });
  if (s.status !== 201) throw new Error(`fixture scenario failed: ${s.status}`);
  const run = await call(`/api/scenarios/${s.body.id}/runs`, { method: "POST", cookie: admin, body: { seed: "advisory", iterations: 10 } });
  if (run.status !== 201) throw new Error(`fixture run failed: ${run.status}`);
  return s.body.id;
}

const tokenOf = (url: string) => new URL(url).pathname.split("/").filter(Boolean).at(-1)!;

beforeAll(async () => {
  for (const role of ["viewer", "inspector", "scheduler", "engineer", "admin"] as DemoRole[]) cookieOf[role] = await signInAs(role);
  cookieOf.signedOut = null;
  cookieOf.nonMember = await signIn(demoEmail("scheduler"));
  const admin = await signInAs("admin");
  projectId = (await kestrelProject(admin)).id;
  const projects = (await call("/api/projects", { cookie: admin })).body.projects as { id: string; name: string }[];
  ternProjectId = projects.find((p) => p.name.includes("Tern"))!.id;
  base = await demoDefinition(admin, projectId);
}, 120_000);

describe("closure publication preview and publish, by role", { timeout: 120_000 }, () => {
  it.each(EVERYONE)("GET preview as %s", async (who) => {
    const id = await scenarioWithRun(who, `preview ${who}`);
    const res = await call(`/api/scenarios/${id}/closure-publications/preview`, { cookie: cookieOf[who] });
    expect(res.status, JSON.stringify(res.body)).toBe(editors(200)[who]);
    if (res.status === 200) {
      expect(res.body.closureCount).toBeGreaterThan(0);
      expect(res.body.text).toContain("closed");
    }
  });

  it.each(EVERYONE)("POST publish the previewed run as %s", async (who) => {
    const id = await scenarioWithRun(who, `publish ${who}`);
    const preview = await call(`/api/scenarios/${id}/closure-publications/preview`, { cookie: await signInAs("admin") });
    const res = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: cookieOf[who], body: { runId: preview.body.runId } });
    expect(res.status, JSON.stringify(res.body)).toBe(editors(201)[who]);
  });

  it("a publication naming another run than the latest is refused and nothing is published", async () => {
    const admin = await signInAs("admin");
    const id = await scenarioWithRun("admin", "stale preview");
    const before = (await call(`/api/scenarios/${id}/closure-publications`, { cookie: admin })).body.publications.length;
    const res = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: "00000000-0000-4000-8000-000000000000" } });
    expect(res.status).toBe(409);
    const bad = await call(`/api/scenarios/${id}/closure-publications`, { method: "POST", cookie: admin, body: { runId: "not-an-id" } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].path).toBe("runId");
    expect((await call(`/api/scenarios/${id}/closure-publications`, { cookie: admin })).body.publications.length).toBe(before);
  });
});

describe("the public travel advisory: no sign-in, scoped to one published plan", { timeout: 120_000 }, () => {
  let published: { advisoryUrl: string; feedUrl: string };
  let scenarioShareToken: string;
  let scenarioId: string;

  beforeAll(async () => {
    const admin = await signInAs("admin");
    scenarioId = await scenarioWithRun("admin", "advisory scope");
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
    const token = tokenOf(again.body.advisoryUrl);
    expect((await call(`/advisory/${token}`)).status).toBe(200);
    const links = (await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: admin })).body.links as { id: string; revokedAt: string | null; createdAt: string }[];
    const newest = links.filter((l) => !l.revokedAt).sort((a, b) => b.createdAt.localeCompare(a.createdAt))[0];
    expect((await call(`/api/share-links/${newest.id}`, { method: "DELETE", cookie: admin })).status).toBe(200);
    expect((await call(`/advisory/${token}`)).status).toBe(404);
    expect((await call(`/api/shared/${token}/closures.ics`)).status).toBe(404);
  });
});
