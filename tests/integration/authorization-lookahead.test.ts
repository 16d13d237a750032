/**
 * Authorization rows for the week-ahead routes, in the form of the matrix in authorization.test.ts (to be
 * folded into it): every route, as each role, as a non-member and signed out.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signIn, signInAs, demoEmail, type DemoRole } from "../helpers/app";
import { lookAheadDefinition } from "../helpers/look-ahead-fixture";

type Who = DemoRole | "signedOut" | "nonMember";
const EVERYONE: Who[] = ["signedOut", "nonMember", "viewer", "inspector", "scheduler", "engineer", "admin"];

interface Fixture {
  projectId: string;
  ternProjectId: string;
}
let fx: Fixture;
const cookieOf: Partial<Record<Who, string | null>> = {};

interface Case {
  name: string;
  method: "GET" | "PUT";
  prepare: (f: Fixture, who: Who) => Promise<{ path: string; body?: unknown }>;
  expect: Record<Who, number>;
}

const adminCookie = () => signInAs("admin");
const projectOf = (f: Fixture, who: Who) => (who === "nonMember" ? f.ternProjectId : f.projectId);

async function scenarioFor(f: Fixture, who: Who, label: string): Promise<{ id: string }> {
  const res = await call(`/api/projects/${projectOf(f, who)}/scenarios`, { method: "POST", cookie: await adminCookie(), body: { name: label, definition: lookAheadDefinition(label) } });
  if (res.status !== 201) throw new Error(`fixture failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** The project's location as it is, so the matrix changes nothing other tests rely on. */
async function currentLocation(projectId: string) {
  const p = (await call(`/api/projects/${projectId}`, { cookie: await adminCookie() })).body.project;
  return { latitude: p.latitude ?? null, longitude: p.longitude ?? null };
}

const readAll = (ok = 200): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: ok, inspector: ok, scheduler: ok, engineer: ok, admin: ok });
const sharers = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: ok, engineer: ok, admin: ok });
const locators = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: 403, engineer: ok, admin: ok });

const CASES: Case[] = [
  { name: "read the week ahead", method: "GET", prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "wa read")).id}/look-ahead` }), expect: readAll() },
  {
    name: "set the project location",
    method: "PUT",
    prepare: async (f, w) => ({ path: `/api/projects/${projectOf(f, w)}/location`, body: await currentLocation(projectOf(f, w)) }),
    expect: locators(200),
  },
  { name: "read the daily notice", method: "GET", prepare: async (f, w) => ({ path: `/api/scenarios/${(await scenarioFor(f, w, "wa notice")).id}/look-ahead/notice` }), expect: sharers(200) },
  {
    name: "set the daily notice",
    method: "PUT",
    prepare: async (f, w) => ({
      path: `/api/scenarios/${(await scenarioFor(f, w, "wa notice set")).id}/look-ahead/notice`,
      body: { enabled: false, hour: 6, recipients: ["field-team@marrin-dot.example"] },
    }),
    expect: sharers(200),
  },
];

beforeAll(async () => {
  for (const role of ["viewer", "inspector", "scheduler", "engineer", "admin"] as DemoRole[]) cookieOf[role] = await signInAs(role);
  cookieOf.signedOut = null;
  cookieOf.nonMember = await signIn(demoEmail("scheduler"));
  const admin = await adminCookie();
  const projects = (await call("/api/projects", { cookie: admin })).body.projects as { id: string; name: string }[];
  fx = { projectId: (await kestrelProject(admin)).id, ternProjectId: projects.find((p) => p.name.includes("Tern"))!.id };
});

describe.each(CASES)("$method $name", (c) => {
  it.each(EVERYONE)("as %s", async (who) => {
    const { path, body } = await c.prepare(fx, who);
    const res = await call(path, { method: c.method, body, cookie: cookieOf[who] });
    expect(res.status, `${c.method} ${path} as ${who}: ${JSON.stringify(res.body)?.slice(0, 300)}`).toBe(c.expect[who]);
    if (res.status >= 400) expect(typeof res.body.error).toBe("string");
  });
});
