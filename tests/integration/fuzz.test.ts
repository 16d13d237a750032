/**
 * Fuzzing the write routes: POURLINE_FUZZ_RUNS (default 2,000) generated invalid or extreme bodies per route —
 * scenario create and update, field progress (a shift, and shifts loaded from a file), share links (of a scenario and of a plan search), CSV
 * uploads — sent over HTTP with bounded concurrency.
 * Every answer must be below 500, arrive within PER_REQUEST_MS, and a 400 must name its fields. Nothing may be
 * stored except by a 2xx answer: the rows counted after the run must equal the rows before plus the 2xx answers
 * (a generated body can be valid by chance; it then counts as a save, honestly, and is reported).
 * The bodies are drawn with fast-check from POURLINE_FUZZ_SEED (printed), so a failure can be replayed.
 */
import { beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { APP_URL, call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { createPastScenario } from "../helpers/progress-fixture";
import { millingShift, newSearch } from "../helpers/authz-world";
import { bodiesFrom, uploadBodies, type FuzzBody, type FuzzUpload } from "../helpers/fuzz-bodies";

const RUNS = Number(process.env.POURLINE_FUZZ_RUNS ?? 2_000);
const SEED = Number(process.env.POURLINE_FUZZ_SEED ?? Date.now() % 2 ** 31);
const CONCURRENCY = Number(process.env.POURLINE_FUZZ_CONCURRENCY ?? 4);
/** A correctness guard against requests that hang or pin the server, not a speed measurement. */
const PER_REQUEST_MS = 5_000;
const ROUTE_TIMEOUT_MS = Math.max(120_000, RUNS * 150);

let cookie: string;
let projectId: string;
let base: Record<string, unknown>;
let target: { id: string; version: number };
let field: { id: string };

beforeAll(async () => {
  console.log(`[fuzz] ${RUNS} bodies per route, seed ${SEED} (POURLINE_FUZZ_SEED=${SEED} replays them), ${CONCURRENCY} at a time`);
  cookie = await signInAs("admin");
  projectId = (await kestrelProject(cookie)).id;
  base = await demoDefinition(cookie, projectId);
  const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name: "Fuzz target", definition: { ...base, name: "Fuzz target" } } });
  expect(created.status).toBe(201);
  target = created.body;
  field = await createPastScenario(cookie, projectId, "Fuzz field log");
});

interface Outcome {
  status: number;
  ms: number;
  body: any;
  note: string;
}

async function sendAll<T extends { note: string }>(items: T[], send: (item: T) => Promise<Response>): Promise<Outcome[]> {
  const out: Outcome[] = new Array(items.length);
  let next = 0;
  async function worker() {
    while (next < items.length) {
      const i = next++;
      const started = performance.now();
      let res: Response;
      let text: string;
      try {
        // One retry when the connection was closed under the request: the test's HTTP client reuses idle
        // keep-alive connections, and one the server has just timed out is closed before it reads anything.
        res = await send(items[i]).catch(() => send(items[i]));
        text = await res.text();
      } catch (e) {
        // No answer at all (the connection was closed on us) is a finding like a 500, reported with its body.
        out[i] = { status: 0, ms: performance.now() - started, body: `no answer: ${(e as Error).cause ?? e}`, note: items[i].note };
        continue;
      }
      const ms = performance.now() - started;
      let body: any = text;
      try {
        body = JSON.parse(text);
      } catch {}
      out[i] = { status: res.status, ms, body, note: items[i].note };
    }
  }
  await Promise.all(Array.from({ length: CONCURRENCY }, worker));
  return out;
}

const json = (method: string, path: string) => (b: FuzzBody) =>
  fetch(`${APP_URL}${path}`, { method, headers: { cookie, origin: APP_URL, "content-type": "application/json" }, body: b.text });

function upload(path: string) {
  return (u: FuzzUpload) => {
    const form = new FormData();
    for (const [k, v] of Object.entries(u.fields)) form.append(k, v);
    if (u.file) form.set("file", new Blob([u.file.content], { type: u.file.type }), u.file.name);
    return fetch(`${APP_URL}${path}`, { method: "POST", headers: { cookie, origin: APP_URL }, body: form });
  };
}

/** A 400 names its fields: a non-empty list of problems, each with a path and a message in words. */
function namesItsFields(body: any): boolean {
  return Array.isArray(body?.fields) && body.fields.length > 0 && body.fields.every((f: any) => typeof f?.path === "string" && f.path.length > 0 && typeof f?.message === "string" && f.message.length > 0);
}

function judge(route: string, outcomes: Outcome[]) {
  const bad = (why: string, o: Outcome) => `${why}: ${o.status} in ${Math.round(o.ms)} ms — ${o.note} → ${JSON.stringify(o.body)?.slice(0, 300)}`;
  const problems = [
    ...outcomes.filter((o) => o.status === 0).map((o) => bad("no answer", o)),
    ...outcomes.filter((o) => o.status >= 500).map((o) => bad("server error", o)),
    ...outcomes.filter((o) => o.ms > PER_REQUEST_MS).map((o) => bad(`slower than ${PER_REQUEST_MS} ms`, o)),
    ...outcomes.filter((o) => o.status === 400 && !namesItsFields(o.body)).map((o) => bad("a 400 that names no field", o)),
  ];
  const byStatus: Record<number, number> = {};
  for (const o of outcomes) byStatus[o.status] = (byStatus[o.status] ?? 0) + 1;
  console.log(`[fuzz] ${route}: ${outcomes.length} bodies, answers ${JSON.stringify(byStatus)}, slowest ${Math.round(Math.max(...outcomes.map((o) => o.ms)))} ms`);
  // Soft, so the "nothing stored" count after it is checked even when some answers were bad.
  expect.soft(problems.length, `${route}: ${problems.length} bad answers (seed ${SEED}); first ones:\n${problems.slice(0, 8).join("\n")}`).toBe(0);
  return outcomes.filter((o) => o.status >= 200 && o.status < 300).length;
}

const count = async (path: string, key: string) => {
  const res = await call(path, { cookie });
  expect(res.status).toBe(200);
  return (res.body[key] as unknown[]).length;
};
const sample = <T>(arb: fc.Arbitrary<T>, salt: number) => fc.sample(arb, { numRuns: RUNS, seed: SEED + salt });

describe(`fuzz: ${RUNS} generated bodies per write route`, () => {
  it("POST /api/projects/:id/scenarios", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const before = await count(`/api/projects/${projectId}/scenarios`, "scenarios");
    const bodies = sample(bodiesFrom(() => structuredClone({ name: "Fuzzed", description: "", changeNote: "", definition: base })), 1);
    const stored = judge("create scenario", await sendAll(bodies, json("POST", `/api/projects/${projectId}/scenarios`)));
    expect(await count(`/api/projects/${projectId}/scenarios`, "scenarios")).toBe(before + stored);
  });

  it("PUT /api/scenarios/:id", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const bodies = sample(bodiesFrom(() => structuredClone({ name: "Fuzz target", description: "", changeNote: "", definition: base, version: target.version })), 2);
    const saved = judge("update scenario", await sendAll(bodies, json("PUT", `/api/scenarios/${target.id}`)));
    const after = await call(`/api/scenarios/${target.id}`, { cookie });
    expect(after.body.scenario.version).toBe(target.version + saved);
    expect(after.body.revisions.length).toBe(1 + saved);
    if (saved === 0) expect(after.body.scenario.definition).toEqual({ ...base, name: "Fuzz target" });
  });

  it("POST /api/scenarios/:id/progress", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/scenarios/${field.id}/progress`;
    const before = await count(path, "entries");
    const bodies = sample(bodiesFrom(() => structuredClone(millingShift({ discovered: [{ kind: "bottom-mat", fromStationFt: 100, toStationFt: 120, areaSqFt: 40 }] }))), 3);
    const stored = judge("record progress", await sendAll(bodies, json("POST", path)));
    expect(await count(path, "entries")).toBe(before + stored);
  });

  it("POST /api/scenarios/:id/share-links", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/scenarios/${target.id}/share-links`;
    const before = await count(path, "links");
    const bodies = sample(bodiesFrom(() => ({ label: "Fuzzed link", expiresInDays: 7, emailTo: [] as string[] })), 4);
    const stored = judge("create share link", await sendAll(bodies, json("POST", path)));
    expect(await count(path, "links")).toBe(before + stored);
  });

  it("POST /api/searches/:id/share-links", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/searches/${await newSearch(target.id, cookie)}/share-links`;
    const before = await count(path, "links");
    const bodies = sample(bodiesFrom(() => ({ label: "Fuzzed search link", expiresInDays: 7, emailTo: [] as string[] })), 6);
    const stored = judge("create search link", await sendAll(bodies, json("POST", path)));
    expect(await count(path, "links")).toBe(before + stored);
  });

  it("POST /api/scenarios/:id/progress/import (multipart)", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/scenarios/${field.id}/progress`;
    const before = await count(path, "entries");
    const stored = judge("load shifts from a file", await sendAll(sample(uploadBodies, 7), upload(`${path}/import`)));
    // A file loads whole or not at all; none of these can load (no cell is a work date the plan accepts).
    expect(stored).toBe(0);
    expect(await count(path, "entries")).toBe(before);
  });

  it("POST /api/scenarios/:id/progress/import/check (multipart)", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/scenarios/${field.id}/progress`;
    const before = await count(path, "entries");
    const passed = judge("check a file of shifts", await sendAll(sample(uploadBodies, 8), upload(`${path}/import/check`)));
    // The check reads as the import does (none of these passes it) and stores nothing whatever it answers.
    expect(passed).toBe(0);
    expect(await count(path, "entries")).toBe(before);
  });

  it("POST /api/scenarios/:id/uploads (multipart)", { timeout: ROUTE_TIMEOUT_MS }, async () => {
    const path = `/api/scenarios/${target.id}/uploads`;
    const before = await count(path, "uploads");
    const stored = judge("upload", await sendAll(sample(uploadBodies, 5), upload(path)));
    expect(await count(path, "uploads")).toBe(before + stored);
  });
});
