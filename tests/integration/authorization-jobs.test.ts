/**
 * The authorization matrix rows of the engine-job and plan-search routes (to be folded into the table-driven
 * authorization test): each tried as each role, as a non-member (the scheduler, on the Tern Point project)
 * and signed out. Jobs are started by the admin, so "owner or admin" cancels are checked separately below.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signIn, signInAs, demoEmail, type DemoRole } from "../helpers/app";
import { waitForJob } from "../helpers/jobs";

type Who = DemoRole | "signedOut" | "nonMember";
const EVERYONE: Who[] = ["signedOut", "nonMember", "viewer", "inspector", "scheduler", "engineer", "admin"];
const cookieOf: Partial<Record<Who, string | null>> = {};
let projectId: string;
let ternProjectId: string;
let base: Record<string, unknown>;

const readAll = (ok = 200): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: ok, inspector: ok, scheduler: ok, engineer: ok, admin: ok });
const runners = (ok: number): Record<Who, number> => ({ signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: ok, engineer: ok, admin: ok });

const admin = () => signInAs("admin");

async function scenarioFor(who: Who, label: string) {
  const pid = who === "nonMember" ? ternProjectId : projectId;
  const res = await call(`/api/projects/${pid}/scenarios`, { method: "POST", cookie: await admin(), body: { name: label, definition: { ...base, name: label } } });
  if (res.status !== 201) throw new Error(`fixture scenario failed: ${res.status}`);
  return res.body as { id: string };
}

/** A queued job nobody will finish soon: a run big enough to still be going when the case runs. */
async function jobFor(who: Who, iterations = 20) {
  const s = await scenarioFor(who, `job for ${who}`);
  const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: await admin(), body: { seed: `auth-${who}-${Date.now()}`, iterations } });
  if (res.status !== 202) throw new Error(`fixture job failed: ${res.status}`);
  return res.body.job.id as string;
}

const SPEC = { dimensions: [{ kind: "holidayPolicy", values: ["standDown", "workThrough"] }], maxVariants: 4, iterations: 100, seed: "auth" };

async function searchFor(who: Who) {
  const s = await scenarioFor(who, `search for ${who}`);
  const res = await call(`/api/scenarios/${s.id}/searches`, { method: "POST", cookie: await admin(), body: { name: "auth search", spec: SPEC } });
  if (res.status !== 202) throw new Error(`fixture search failed: ${res.status} ${JSON.stringify(res.body)}`);
  await waitForJob(res.body.job.id, await admin(), { timeoutMs: 120_000 });
  return res.body.search.id as string;
}

interface Case {
  name: string;
  method: "GET" | "POST" | "DELETE";
  prepare: (who: Who) => Promise<{ path: string; body?: unknown }>;
  expect: Record<Who, number>;
}

const CASES: Case[] = [
  { name: "read a job", method: "GET", prepare: async (w) => ({ path: `/api/jobs/${await jobFor(w)}` }), expect: readAll() },
  // The admin started the job: other runners are not its owner, so they get 403; the admin may cancel.
  {
    name: "cancel someone else's job",
    method: "DELETE",
    prepare: async (w) => ({ path: `/api/jobs/${await jobFor(w, 50_000)}` }),
    expect: { signedOut: 401, nonMember: 404, viewer: 403, inspector: 403, scheduler: 403, engineer: 403, admin: 200 },
  },
  { name: "list searches", method: "GET", prepare: async (w) => ({ path: `/api/scenarios/${(await scenarioFor(w, "searches")).id}/searches` }), expect: readAll() },
  {
    name: "start a search",
    method: "POST",
    prepare: async (w) => ({ path: `/api/scenarios/${(await scenarioFor(w, "search me")).id}/searches`, body: { name: `by ${w}`, spec: SPEC } }),
    expect: runners(202),
  },
  { name: "read a search", method: "GET", prepare: async (w) => ({ path: `/api/searches/${await searchFor(w)}` }), expect: readAll() },
  {
    name: "save a search variant as a scenario",
    method: "POST",
    prepare: async (w) => ({ path: `/api/searches/${await searchFor(w)}/scenarios`, body: { idx: 1, name: `variant by ${w}` } }),
    expect: runners(201),
  },
];

beforeAll(async () => {
  for (const role of ["viewer", "inspector", "scheduler", "engineer", "admin"] as DemoRole[]) cookieOf[role] = await signInAs(role);
  cookieOf.signedOut = null;
  cookieOf.nonMember = await signIn(demoEmail("scheduler"));
  const a = await admin();
  projectId = (await kestrelProject(a)).id;
  const projects = (await call("/api/projects", { cookie: a })).body.projects as { id: string; name: string }[];
  ternProjectId = projects.find((p) => p.name.includes("Tern"))!.id;
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: a });
  const demo = list.body.scenarios.find((s: { name: string }) => s.name.startsWith("Kestrel Bay Causeway"));
  base = (await call(`/api/scenarios/${demo.id}`, { cookie: a })).body.scenario.definition;
}, 60_000);

describe.each(CASES)("$method $name", (c) => {
  it.each(EVERYONE)(
    "as %s",
    async (who) => {
      const { path, body } = await c.prepare(who);
      const res = await call(path, { method: c.method, body, cookie: cookieOf[who] });
      expect(res.status, `${c.method} ${path} as ${who}: ${JSON.stringify(res.body)?.slice(0, 300)}`).toBe(c.expect[who]);
      if (res.status >= 400) expect(typeof res.body.error).toBe("string");
      // Leave no heavy job behind for the next case.
      if (c.method === "DELETE" && res.status !== 200) await call(path, { method: "DELETE", cookie: await admin() });
    },
    150_000,
  );
});

describe("cancel by its owner", () => {
  it("the scheduler who started a job may cancel it; a second cancel is a conflict", async () => {
    const scheduler = await signInAs("scheduler");
    const s = await scenarioFor("scheduler", "owner cancels");
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: `own-${Date.now()}`, iterations: 50_000 } });
    expect(res.status).toBe(202);
    const del = await call(`/api/jobs/${res.body.job.id}`, { method: "DELETE", cookie: scheduler });
    expect(del.status).toBe(200);
    expect(del.body.job.status).toBe("cancelled");
    const again = await call(`/api/jobs/${res.body.job.id}`, { method: "DELETE", cookie: scheduler });
    expect(again.status).toBe(409);
  });
});
