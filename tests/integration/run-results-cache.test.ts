/**
 * How the read API answers a team reading the same runs over and over (GET /api/runs/:id from the copy of
 * the results stored with the run; the project's scenario list): a strong ETag and 304 for a client that holds
 * the current version, gzip that decodes to exactly the plain body, a new tag whenever the run's marks change
 * (stale after an edit, verified after the server reproduced it), the copy made on first read for a row stored
 * before it, and access checked before any validator — a stranger never learns a run exists from a 304. The
 * stored copy is also held in the server's memory; that must neither outlive a change of the copy nor of access.
 * Raw HTTP (node:http), so the test sees the bytes and headers as sent, not a decoded body.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { gunzipSync } from "node:zlib";
import type postgres from "postgres";
import { call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { serverRunDone, waitForJob } from "../helpers/jobs";
import { raw, type RawReply } from "../helpers/raw-http";
import { appDatabase, freshScenario, freshUser } from "../helpers/fresh-team";
import { parseScenario, runScenario } from "../../sim/index";

const GZIP = "gzip, deflate, br, zstd";
const json = (r: RawReply) => JSON.parse((r.headers["content-encoding"] === "gzip" ? gunzipSync(r.body) : r.body).toString("utf8"));

let db: postgres.Sql;
let scheduler: string;
let projectId: string;
let base: Record<string, unknown>;

beforeAll(async () => {
  db = appDatabase();
  scheduler = await signInAs("scheduler");
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

async function scenarioWithServerRun(name: string, seed = "cache") {
  const s = await freshScenario(scheduler, projectId, base, name);
  const job = await serverRunDone(s.id, scheduler, { seed, iterations: 20 });
  if (job.status !== "completed" || !job.runId) throw new Error(`fixture run ${job.status}: ${job.error}`);
  return { ...s, runId: job.runId };
}

describe("a run's results", () => {
  it("come gzip-encoded with a strong ETag, decode to exactly the plain body, and a client holding them gets 304", async () => {
    const { runId } = await scenarioWithServerRun("Cache round trip");
    const path = `/api/runs/${runId}`;
    const gz = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    const plain = await raw(path, { cookie: scheduler, "accept-encoding": "identity" });
    expect(gz.status).toBe(200);
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(gz.headers["x-pourline-content-encoding"], "the private header never leaves the server").toBeUndefined();
    expect(gz.headers["cache-control"]).toBe("private, no-cache");
    expect(String(gz.headers.vary)).toMatch(/Accept-Encoding/i);
    expect(plain.status).toBe(200);
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(plain.headers["cache-control"]).toBe("private, no-cache, no-transform");
    // Strong tags, one per representation.
    expect(gz.headers.etag).toMatch(/^"[A-Za-z0-9_.-]+-gz"$/);
    expect(plain.headers.etag).toMatch(/^"[A-Za-z0-9_.-]+"$/);
    expect(plain.headers.etag).toBe(String(gz.headers.etag).replace(/-gz"$/, '"'));
    expect(gz.body.length).toBeLessThan(plain.body.length / 3);
    expect(gunzipSync(gz.body).equals(plain.body)).toBe(true);
    // A known length, not chunked: the whole answer can leave in one write.
    for (const r of [gz, plain]) {
      expect(r.headers["content-length"]).toBe(String(r.body.length));
      expect(r.headers["transfer-encoding"]).toBeUndefined();
      expect(Object.keys(r.headers).filter((h) => h.startsWith("x-pourline-"))).toEqual([]);
    }
    // What is sent is what the results column holds.
    const [row] = await db`SELECT results FROM simulation_runs WHERE id = ${runId}`;
    expect(json(plain).run.results).toEqual(row.results);
    expect(json(plain).run).toMatchObject({ id: runId, verification: "server", stale: false, planRun: true, iterations: 20, seed: "cache" });

    for (const [encoding, first] of [[GZIP, gz], ["identity", plain]] as const) {
      const again = await raw(path, { cookie: scheduler, "accept-encoding": encoding, "if-none-match": String(first.headers.etag) });
      expect(again.status, encoding).toBe(304);
      expect(again.body.length).toBe(0);
      expect(again.headers.etag).toBe(first.headers.etag);
    }
    // Another representation's tag does not stand for this one.
    expect((await raw(path, { cookie: scheduler, "accept-encoding": "identity", "if-none-match": String(gz.headers.etag) })).status).toBe(200);
  });

  it("get a new tag when the plan is saved again: the same results, now marked stale", async () => {
    const s = await scenarioWithServerRun("Cache stale mark");
    const path = `/api/runs/${s.runId}`;
    const before = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    expect(json(before).run.stale).toBe(false);
    const put = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "Cache stale mark", definition: { ...base, name: "Cache stale mark", description: "edited" }, version: s.version } });
    expect(put.status).toBe(200);
    const after = await raw(path, { cookie: scheduler, "accept-encoding": GZIP, "if-none-match": String(before.headers.etag) });
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    expect(json(after).run.stale).toBe(true);
    expect(json(after).run.results).toEqual(json(before).run.results);
  });

  it("get a new tag when a browser run is verified: pending first, then verified, from the same stored copy", async () => {
    const s = await freshScenario(scheduler, projectId, base, "Cache verification mark");
    const parsed = parseScenario({ ...base, name: "Cache verification mark" });
    if (!parsed.ok) throw new Error("base scenario invalid");
    const summary = runScenario(parsed.scenario, { iterations: 30, seed: "v" });
    const posted = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "v", iterations: 30, scenarioVersion: s.version, summary } });
    expect(posted.status).toBe(201);
    const path = `/api/runs/${posted.body.id}`;
    const pending = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    // The verify job may already have run; what is sent must match the row either way.
    const [first] = await db`SELECT verification FROM simulation_runs WHERE id = ${posted.body.id}`;
    expect(json(pending).run.verification).toBe(first.verification);
    expect((await waitForJob(posted.body.verifyJobId, scheduler)).status).toBe("completed");
    const verified = await raw(path, { cookie: scheduler, "accept-encoding": GZIP, "if-none-match": String(pending.headers.etag) });
    if (first.verification === "pending") {
      expect(verified.status).toBe(200);
      expect(verified.headers.etag).not.toBe(pending.headers.etag);
    } else expect(verified.status).toBe(304);
    const now = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    expect(json(now).run.verification).toBe("verified");
    expect(json(now).run.results).toEqual(JSON.parse(JSON.stringify(summary)));
  });

  it("stored before the copy existed: made on the first read, with the same JSON, and kept", async () => {
    const { runId } = await scenarioWithServerRun("Cache back-fill");
    const path = `/api/runs/${runId}`;
    const original = await raw(path, { cookie: scheduler, "accept-encoding": "identity" });
    await db`UPDATE simulation_runs SET results_deflate = NULL, results_crc32 = NULL, results_length = NULL, results_etag = NULL WHERE id = ${runId}`;
    const filled = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    expect(filled.status).toBe(200);
    expect(json(filled)).toEqual(json(original));
    const [row] = await db`SELECT num_nonnulls(results_deflate, results_crc32, results_length, results_etag) AS n FROM simulation_runs WHERE id = ${runId}`;
    expect(row.n).toBe(4);
    const again = await raw(path, { cookie: scheduler, "accept-encoding": GZIP, "if-none-match": String(filled.headers.etag) });
    expect(again.status).toBe(304);
  });

  it("refuse a half-written copy: the four stored columns are all set or all empty", async () => {
    const { runId } = await scenarioWithServerRun("Cache whole copy");
    await expect(db`UPDATE simulation_runs SET results_etag = NULL WHERE id = ${runId}`).rejects.toThrow();
  });
});

describe("a run's results held in the server's memory", () => {
  it("follow the stored copy: a run whose copy changes in the database is served from the new copy at once", async () => {
    const a = await scenarioWithServerRun("Memory copy A", "mem-a");
    const b = await scenarioWithServerRun("Memory copy B", "mem-b");
    const pathA = `/api/runs/${a.runId}`;
    const first = await raw(pathA, { cookie: scheduler, "accept-encoding": GZIP });
    await raw(pathA, { cookie: scheduler, "accept-encoding": GZIP }); // now certainly held in memory
    // Give run A run B's results and stored copy (a stand-in for any change to a run's results).
    await db`UPDATE simulation_runs a SET results = b.results, results_deflate = b.results_deflate, results_crc32 = b.results_crc32,
      results_length = b.results_length, results_etag = b.results_etag FROM simulation_runs b WHERE a.id = ${a.runId} AND b.id = ${b.runId}`;
    const after = await raw(pathA, { cookie: scheduler, "accept-encoding": GZIP });
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(first.headers.etag);
    const [row] = await db`SELECT results FROM simulation_runs WHERE id = ${b.runId}`;
    expect(json(after).run.results).toEqual(row.results);
    expect(json(after).run.results).not.toEqual(json(first).run.results);
  });

  it("do not hold access: a member removed from the project gets 404 on the very next read", async () => {
    const { runId } = await scenarioWithServerRun("Memory copy access");
    const member = await freshUser(db, "memory-member");
    await db`INSERT INTO project_members (project_id, user_id, role) VALUES (${projectId}, ${member.id}, 'viewer')`;
    const cookie = await member.cookie();
    const path = `/api/runs/${runId}`;
    expect((await raw(path, { cookie, "accept-encoding": GZIP })).status).toBe(200);
    expect((await raw(path, { cookie, "accept-encoding": GZIP })).status).toBe(200);
    await db`DELETE FROM project_members WHERE project_id = ${projectId} AND user_id = ${member.id}`;
    const refused = await raw(path, { cookie, "accept-encoding": GZIP });
    expect(refused.status).toBe(404);
    expect(refused.headers.etag).toBeUndefined();
  });
});

describe("the scenario list", () => {
  it("is gzip-encoded by the route when the client takes it: the same JSON as the plain body, with its length", async () => {
    const path = `/api/projects/${projectId}/scenarios`;
    const gz = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    const plain = await raw(path, { cookie: scheduler, "accept-encoding": "identity" });
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(gunzipSync(gz.body).equals(plain.body)).toBe(true);
    // Weak: the two bodies are the same JSON, so one tag stands for both.
    expect(gz.headers.etag).toBe(plain.headers.etag);
    for (const r of [gz, plain]) {
      expect(r.headers["content-length"]).toBe(String(r.body.length));
      expect(r.headers["transfer-encoding"]).toBeUndefined();
      expect(Object.keys(r.headers).filter((h) => h.startsWith("x-pourline-"))).toEqual([]);
    }
  });

  it("has a weak ETag of its content: 304 while nothing changed, 200 with the new run once one is stored", async () => {
    const s = await scenarioWithServerRun("Cache list", "list-1");
    const path = `/api/projects/${projectId}/scenarios`;
    const first = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
    expect(first.status).toBe(200);
    expect(first.headers.etag).toMatch(/^W\/"[A-Za-z0-9_-]+"$/);
    expect(first.headers["cache-control"]).toBe("private, no-cache");
    expect((await raw(path, { cookie: scheduler, "accept-encoding": GZIP, "if-none-match": String(first.headers.etag) })).status).toBe(304);
    const newer = await serverRunDone(s.id, scheduler, { seed: "list-2", iterations: 20 });
    const after = await raw(path, { cookie: scheduler, "accept-encoding": GZIP, "if-none-match": String(first.headers.etag) });
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(first.headers.etag);
    expect(json(after).scenarios.find((x: { id: string }) => x.id === s.id).runId).toBe(newer.runId);
    // A different run has different results: its tag differs in the results' part too.
    const [oldTag, newTag] = await Promise.all([s.runId, newer.runId!].map(async (id) => String((await raw(`/api/runs/${id}`, { cookie: scheduler, "accept-encoding": GZIP })).headers.etag)));
    expect(newTag.split(".")[0]).not.toBe(oldTag.split(".")[0]);
  });
});

describe("access before validators", () => {
  it("a stranger holding the current ETag gets 404 without a tag, and a signed-out client 401", async () => {
    const { runId } = await scenarioWithServerRun("Cache stranger");
    const runPath = `/api/runs/${runId}`;
    const listPath = `/api/projects/${projectId}/scenarios`;
    const stranger = await (await freshUser(db, "cache-stranger")).cookie();
    for (const path of [runPath, listPath]) {
      const member = await raw(path, { cookie: scheduler, "accept-encoding": GZIP });
      const etag = String(member.headers.etag);
      const refused = await raw(path, { cookie: stranger, "accept-encoding": GZIP, "if-none-match": etag });
      expect(refused.status, path).toBe(404);
      expect(refused.headers.etag, path).toBeUndefined();
      expect(typeof json(refused).error).toBe("string");
      const star = await raw(path, { cookie: stranger, "if-none-match": "*" });
      expect(star.status, path).toBe(404);
      const signedOut = await raw(path, { "accept-encoding": GZIP, "if-none-match": etag });
      expect(signedOut.status, path).toBe(401);
      expect(signedOut.headers.etag, path).toBeUndefined();
    }
  });

  it("a member with the read-only role gets the run and, holding it, a 304", async () => {
    const { runId } = await scenarioWithServerRun("Cache viewer");
    const viewer = await signInAs("viewer");
    const got = await raw(`/api/runs/${runId}`, { cookie: viewer, "accept-encoding": GZIP });
    expect(got.status).toBe(200);
    expect((await raw(`/api/runs/${runId}`, { cookie: viewer, "accept-encoding": GZIP, "if-none-match": String(got.headers.etag) })).status).toBe(304);
  });
});
