/**
 * The authorization matrix: every API route, tried as each role, as a non-member and signed out, must give
 * exactly the status the permission table says. Each case prepares its own resources as the admin, so the
 * order of cases does not matter.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signIn, signInAs, demoEmail, type DemoRole } from "../helpers/app";
import { waitForJob } from "../helpers/jobs";

type Who = DemoRole | "signedOut" | "nonMember";
const EVERYONE: Who[] = ["signedOut", "nonMember", "viewer", "inspector", "scheduler", "engineer", "admin"];

interface Fixture {
  projectId: string;
  ternProjectId: string;
  baseDefinition: Record<string, unknown>;
}
let fx: Fixture;
const cookieOf: Partial<Record<Who, string | null>> = {};

// Every project route is also tried on a project the caller is not a member of: the scheduler is not a member
// of the seeded Tern Point project, so "nonMember" means "the scheduler, on the other project".
interface Case {
  name: string;
  method: "GET" | "POST" | "PUT" | "DELETE";
  prepare: (f: Fixture, who: Who) => Promise<{ path: string; body?: unknown }>;
  expect: Record<Who, number>;
}

async function adminCookie() {
  return signInAs("admin");
}

async function newScenario(f: Fixture, name: string): Promise<{ id: string; version: number }> {
  const res = await call(`/api/projects/${f.projectId}/scenarios`, { method: "POST", cookie: await adminCookie(), body: { name, definition: { ...f.baseDefinition, name } } });
  if (res.status !== 201) throw new Error(`fixture scenario failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

async function scenarioFor(f: Fixture, who: Who, label: string) {
  if (who === "nonMember") {
    // A scenario on the project the scheduler cannot see.
    const res = await call(`/api/projects/${f.ternProjectId}/scenarios`, { method: "POST", cookie: await adminCookie(), body: { name: label, definition: { ...f.baseDefinition, name: label } } });
    if (res.status !== 201) throw new Error(`fixture failed: ${res.status}`);
    return res.body as { id: string; version: number };
  }
  return newScenario(f, label);
}

async function scenarioWithRun(f: Fixture, who: Who, label: string) {
  const s = await scenarioFor(f, who, label);
  const run = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: await adminCookie(), body: { seed: "matrix", iterations: 10 } });
  if (run.status !== 202) throw new Error(`fixture run failed: ${run.status}`);
  // The same computation on every fixture scenario copy is a distinct job (scenario ids differ); wait for it.
  const job = await waitForJob(run.body.job.id, await adminCookie());
  if (job.status !== "completed") throw new Error(`fixture run ${job.status}: ${job.error}`);
  return s;
}

const projectOf = (f: Fixture, who: Who) => (who === "nonMember" ? f.ternProjectId : f.projectId);

const readAll = (ok = 200): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: ok, inspector: ok, scheduler: ok, engineer: ok, admin: ok });
const editors = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: ok, engineer: ok, admin: ok });
const adminOnly = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: 403, engineer: 403, admin: ok });

const CASES: Case[] = [
  { name: "list my projects", method: "GET", prepare: async () => ({ path: "/api/projects" }), expect: { ...readAll(), nonMember: 200 } },
  { name: "read a project", method: "GET", prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}` }), expect: readAll() },
  { name: "list scenarios", method: "GET", prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/scenarios` }), expect: readAll() },
  {
    name: "create a scenario",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/scenarios`, body: { name: `by ${w}`, definition: { ...f.baseDefinition, name: `by ${w}` } } }),
    expect: editors(201),
  },
  {
    name: "read a scenario",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "read me")).id}` }),
    expect: readAll(),
  },
  {
    name: "update a scenario",
    method: "PUT",
    prepare: async (f, w) => {
      const s = await scenarioFor(f, w, "update me");
      return { path: `/api/scenarios/${s.id}`, body: { name: "updated", definition: { ...f.baseDefinition, name: "updated" }, version: s.version } };
    },
    expect: editors(200),
  },
  {
    name: "delete a scenario",
    method: "DELETE",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "delete me")).id}` }),
    expect: editors(200),
  },
  {
    name: "make a variant",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "copy me")).id}/variants`, body: { name: "a variant" } }),
    expect: editors(201),
  },
  {
    name: "list runs",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "runs")).id}/runs` }),
    expect: readAll(),
  },
  {
    name: "save a run (server-computed)",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "run me")).id}/runs`, body: { seed: "matrix", iterations: 20 } }),
    expect: editors(202),
  },
  {
    name: "list share links",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "links")).id}/share-links` }),
    expect: editors(200),
  },
  {
    name: "create a share link",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "share me")).id}/share-links`, body: { expiresInDays: 7 } }),
    expect: editors(201),
  },
  {
    name: "revoke a share link",
    method: "DELETE",
    prepare: async (f, w) => {
      const s = await scenarioFor(f, w, "revoke");
      const link = await call(`/api/scenarios/${s.id}/share-links`, { method: "POST", cookie: await adminCookie(), body: { expiresInDays: 7 } });
      return { path: `/api/share-links/${link.body.id}` };
    },
    expect: editors(200),
  },
  {
    name: "list uploads",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "uploads")).id}/uploads` }),
    expect: readAll(),
  },
  {
    // The role is checked before the body is read: editors get as far as "send a form upload" (400).
    name: "upload a file (sent as JSON, so editors get 400)",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "upload")).id}/uploads`, body: { kind: "survey" } }),
    expect: editors(400),
  },
  {
    name: "export planned closures (iCalendar)",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioWithRun(f, w, "ics")).id}/exports/closures.ics` }),
    expect: readAll(),
  },
  {
    name: "export results (CSV)",
    method: "GET",
    prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioWithRun(f, w, "csv")).id}/exports/results.csv` }),
    expect: readAll(),
  },
  {
    name: "compare scenarios",
    method: "GET",
    prepare: async (f, w) => {
      const a = await scenarioWithRun(f, w, "cmp a");
      const b = await scenarioWithRun(f, w, "cmp b");
      return { path: `/api/projects/${projectOf(f, w)}/compare?ids=${a.id},${b.id}` };
    },
    expect: readAll(),
  },
  {
    name: "invite by e-mail",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/invitations`, body: { email: `invitee-${w}-${Date.now()}@marrin-dot.example`, role: "viewer" } }),
    expect: adminOnly(201),
  },
  { name: "list members", method: "GET", prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/members` }), expect: readAll() },
  {
    name: "add a member",
    method: "POST",
    prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/members`, body: { email: demoEmail("inspector"), role: "inspector" } }),
    expect: adminOnly(201),
  },
  {
    name: "remove a member",
    method: "DELETE",
    prepare: async (f, w) => {
      const projectId = projectOf(f, w);
      // Put the viewer on the project first, so there is someone to remove.
      await call(`/api/projects/${projectId}/members`, { method: "POST", cookie: await adminCookie(), body: { email: demoEmail("viewer"), role: "viewer" } });
      const members = await call(`/api/projects/${projectId}/members`, { cookie: await adminCookie() });
      const viewer = members.body.members.find((m: { email: string }) => m.email === demoEmail("viewer"));
      return { path: `/api/projects/${projectId}/members/${viewer.userId}` };
    },
    expect: adminOnly(200),
  },
];

beforeAll(async () => {
  for (const role of ["viewer", "inspector", "scheduler", "engineer", "admin"] as DemoRole[]) cookieOf[role] = await signInAs(role);
  cookieOf.signedOut = null;
  cookieOf.nonMember = await signIn(demoEmail("scheduler"));
  const admin = await adminCookie();
  const projects = (await call("/api/projects", { cookie: admin })).body.projects as { id: string; name: string }[];
  const projectId = (await kestrelProject(admin)).id;
  const ternProjectId = projects.find((p) => p.name.includes("Tern"))!.id;
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: admin });
  const first = await call(`/api/scenarios/${list.body.scenarios[0].id}`, { cookie: admin });
  fx = { projectId, ternProjectId, baseDefinition: first.body.scenario.definition };
});

// The admin's "remove a member" case takes the viewer off the project; put them back for the other test files.
afterAll(async () => {
  await call(`/api/projects/${fx.projectId}/members`, { method: "POST", cookie: await adminCookie(), body: { email: demoEmail("viewer"), role: "viewer" } });
});

describe.each(CASES)("$method $name", (c) => {
  it.each(EVERYONE)("as %s", async (who) => {
    const { path, body } = await c.prepare(fx, who);
    const res = await call(path, { method: c.method, body, cookie: cookieOf[who] });
    expect(res.status, `${c.method} ${path} as ${who}: ${JSON.stringify(res.body)?.slice(0, 300)}`).toBe(c.expect[who]);
    if (res.status >= 400) expect(typeof res.body.error).toBe("string");
  });
});

describe("cross-site requests", () => {
  it("a state-changing call without this site's Origin is refused before it reaches the handler", async () => {
    const cookie = await signInAs("admin");
    const res = await call(`/api/projects/${fx.projectId}/scenarios`, { method: "POST", cookie, origin: "http://evil.example", body: { name: "x", definition: fx.baseDefinition } });
    expect(res.status).toBe(403);
    const none = await call(`/api/projects/${fx.projectId}/scenarios`, { method: "POST", cookie, origin: null, body: { name: "x", definition: fx.baseDefinition } });
    expect(none.status).toBe(403);
  });
});
