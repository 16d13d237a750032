/** Scenario writes through the real API: validation, optimistic concurrency, and nothing half-saved. */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { appDatabase, freshScenario, freshTeam } from "../helpers/fresh-team";

let projectId: string;
let base: Record<string, unknown>;
let scheduler: string;
let engineer: string;

beforeAll(async () => {
  scheduler = await signInAs("scheduler");
  engineer = await signInAs("engineer");
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
});

async function create(name: string) {
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name, definition: { ...base, name } } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number };
}

describe("optimistic concurrency", () => {
  it("a second save with the same version gets 409 and does not overwrite the first", async () => {
    const s = await create("Concurrency check");
    const first = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "Saved first", definition: { ...base, name: "Saved first" }, version: s.version } });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(s.version + 1);
    const second = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: engineer, body: { name: "Saved second", definition: { ...base, name: "Saved second" }, version: s.version } });
    expect(second.status).toBe(409);
    expect(second.body.current.name).toBe("Saved first");
    expect(second.body.current.version).toBe(s.version + 1);
    const now = await call(`/api/scenarios/${s.id}`, { cookie: scheduler });
    expect(now.body.scenario.name).toBe("Saved first");
    expect(now.body.revisions.map((r: { version: number }) => r.version)).toEqual([2, 1]);
  });
});

describe("a saved version and the one before it", () => {
  it("are read back as stored, for the history's 'what changed'; a version that is not a number or not there is said so", async () => {
    const s = await create("History check");
    const deck = base.deck as { packetFt: number };
    expect(deck.packetFt).not.toBe(50);
    const changed = { ...base, name: "History check", deck: { ...deck, packetFt: 50 } };
    const saved = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "History check", definition: changed, version: s.version, changeNote: "shorter packets" } });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const pair = await call(`/api/scenarios/${s.id}/revisions?version=${s.version + 1}`, { cookie: engineer });
    expect(pair.status).toBe(200);
    expect(pair.body).toMatchObject({ version: s.version + 1, changeNote: "shorter packets", savedByName: "Marco Ilves", previous: { version: s.version } });
    expect(pair.body.definition.deck.packetFt).toBe(50);
    expect(pair.body.previous.definition.deck.packetFt).toBe(deck.packetFt);
    const first = await call(`/api/scenarios/${s.id}/revisions?version=1`, { cookie: engineer });
    expect(first.body.previous).toBeNull();
    const bad = await call(`/api/scenarios/${s.id}/revisions?version=latest`, { cookie: engineer });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual([expect.objectContaining({ path: "version", message: "Version must be a whole number from 1" })]);
    const missing = await call(`/api/scenarios/${s.id}/revisions?version=99`, { cookie: engineer });
    expect(missing.status).toBe(404);
    expect(missing.body.error).toBe("This scenario has no version 99.");
  });
});

describe("validation", () => {
  it("a bad body is 400 with the path of every field at fault, and nothing is saved", async () => {
    const s = await create("Validation check");
    const broken = structuredClone(base) as any;
    broken.deck.lengthFt = -5;
    broken.operations[1].rate.dist = { type: "triangular", min: 100, mode: 300, max: 200 };
    const res = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "", definition: broken, version: s.version } });
    expect(res.status).toBe(400);
    const paths = res.body.fields.map((f: { path: string }) => f.path);
    expect(paths).toContain("name");
    // The body schema fails first on the name; fix it and the engine's own checks report the definition fields.
    const res2 = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "ok", definition: broken, version: s.version } });
    expect(res2.status).toBe(400);
    const paths2 = res2.body.fields.map((f: { path: string }) => f.path);
    expect(paths2).toContain("definition.deck.lengthFt");
    expect(paths2).toContain("definition.operations[1].rate.dist.max");
    const after = await call(`/api/scenarios/${s.id}`, { cookie: scheduler });
    expect(after.body.scenario.version).toBe(s.version);
    expect(after.body.scenario.name).toBe("Validation check");
  });

  it("a body that is not JSON is 400 naming the body", async () => {
    const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: "{not json" });
    expect(res.status).toBe(400);
    expect(res.body.fields[0].path).toBe("(body)");
  });

  it("an unknown scenario id is 404, a malformed one too", async () => {
    expect((await call(`/api/scenarios/00000000-0000-4000-8000-000000000000`, { cookie: scheduler })).status).toBe(404);
    expect((await call(`/api/scenarios/not-a-uuid`, { cookie: scheduler })).status).toBe(404);
  });
});

describe("the scenario list's order", () => {
  it("lists scenarios saved at the same instant by name, whichever was written first", async () => {
    const db = appDatabase();
    try {
      const team = await freshTeam(db, ["scheduler"]);
      const cookie = await team.members[0].cookie();
      for (const name of ["Cedar", "Alder", "Birch"]) await freshScenario(cookie, team.projectId, base, name);
      // As the seed writes them: one transaction, one updated_at for all.
      await db`UPDATE scenarios SET updated_at = '2026-11-02T08:00:00Z' WHERE project_id = ${team.projectId}`;
      const list = await call(`/api/projects/${team.projectId}/scenarios`, { cookie });
      expect(list.status).toBe(200);
      expect(list.body.scenarios.map((s: { name: string }) => s.name)).toEqual(["Alder", "Birch", "Cedar"]);
    } finally {
      await db.end({ timeout: 5 });
    }
  });
});

describe("sign-in", () => {
  it("unknown user and wrong password give the same message", async () => {
    const a = await call("/api/auth/signin", { method: "POST", body: { email: "nobody@marrin-dot.example", password: "whatever" } });
    const b = await call("/api/auth/signin", { method: "POST", body: { email: "engineer@marrin-dot.example", password: "wrong-password" } });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body.error).toBe(b.body.error);
  });

  it("repeated failures lock the account even for the right password", async () => {
    const email = "lockout-probe@marrin-dot.example";
    let last = 0;
    for (let i = 0; i < 6; i++) last = (await call("/api/auth/signin", { method: "POST", body: { email, password: `guess-${i}` } })).status;
    expect(last).toBe(429);
  });

  it("the session cookie is httpOnly, SameSite=Lax and Secure in production", async () => {
    const res = await call("/api/auth/signin", { method: "POST", body: { email: "viewer@nowhere.example", password: "x" } });
    expect(res.status).toBe(401);
    const ok = await fetch(`${process.env.APP_URL}/api/auth/signin`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: process.env.APP_URL! },
      body: JSON.stringify({ email: "director@marrin-dot.example", password: "kestrel-demo" }),
    });
    const cookie = ok.headers.get("set-cookie") ?? "";
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Secure/i);
  });
});
