/**
 * The scenario list and a run are answered by scripts/serve.mjs before Next (src/lib/server/fast-reads.ts);
 * every other request, HEAD included, goes through Next and the route handlers, which call the same answers.
 * So a GET and a HEAD of the same read, with the same headers, take the two ways: they must agree on the status,
 * the validators, the encoding and length, the session cookie and the security headers — for someone signed
 * out, an unknown token, a member (gzip, plain, revalidating) and someone not in the project. Sessions past
 * their renewal point or their absolute limit are handled as on every route (sessions-and-roles.test.ts).
 * Raw HTTP (node:http), so the headers are compared as sent.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import type postgres from "postgres";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { raw, type RawReply } from "../helpers/raw-http";
import { appDatabase, freshUser, FRESH_PASSWORD } from "../helpers/fresh-team";

const COMPARED = ["content-type", "etag", "cache-control", "content-encoding", "content-security-policy", "x-content-type-options", "referrer-policy", "x-frame-options", "cross-origin-opener-policy", "strict-transport-security"];
const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

/** The session cookie's name=value and Max-Age (seconds) from a Set-Cookie, or null. */
function sessionCookieOf(reply: RawReply) {
  const line = ([] as string[]).concat(reply.headers["set-cookie"] ?? []).find((c) => c.startsWith("pourline_session="));
  return line ? { pair: line.split(";")[0], maxAge: Number(/Max-Age=(\d+)/i.exec(line)?.[1]) } : null;
}

/**
 * A GET (the fast way) and a HEAD (through Next) of the same read, compared. Other test files add scenarios to the
 * demo project while this one runs, so the pair is taken between two GETs that agree on the tag: then the list did
 * not change in between, and any difference is the two ways disagreeing.
 */
async function bothWays(path: string, headers: Record<string, string>) {
  for (let attempt = 0; ; attempt++) {
    const get = await raw(path, headers);
    const head = await raw(path, headers, "HEAD");
    const after = await raw(path, headers);
    if (get.status !== 200 || get.headers.etag === after.headers.etag) return compareWays(path, get, head);
    if (attempt === 4) throw new Error(`${path} changed during each of five GET–HEAD–GET triples: nothing compared`);
  }
}

function compareWays(path: string, get: RawReply, head: RawReply) {
  // Next names its router headers in Vary on everything it answers; the fast path names at most the encoding.
  expect(String(get.headers.vary ?? ""), `GET ${path} was answered by Next, not before it`).not.toMatch(/rsc/);
  expect(String(head.headers.vary)).toMatch(/rsc/);
  expect(get.status).toBe(head.status);
  for (const name of COMPARED) expect(get.headers[name], `${name} of ${path}`).toEqual(head.headers[name]);
  if (get.status === 200) expect(get.headers["content-length"]).toBe(head.headers["content-length"]);
  const [a, b] = [sessionCookieOf(get), sessionCookieOf(head)];
  expect(a?.pair).toEqual(b?.pair);
  if (a && b) expect(Math.abs(a.maxAge - b.maxAge)).toBeLessThanOrEqual(2);
  return get;
}

/** A new session of its own (the helpers' sign-in keeps one per person). */
async function newSession(email: string): Promise<string> {
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password: FRESH_PASSWORD } });
  expect(res.status).toBe(200);
  return (res.headers.get("set-cookie") ?? "").split(";")[0];
}

let db: postgres.Sql;
let member: string;
let stranger: string;
let listPath: string;
let runPath: string;

beforeAll(async () => {
  db = appDatabase();
  member = await signInAs("scheduler");
  const projectId = (await kestrelProject(member)).id;
  listPath = `/api/projects/${projectId}/scenarios`;
  const list = (await call(listPath, { cookie: member })).body as { scenarios: { runId: string | null }[] };
  const runId = list.scenarios.find((s) => s.runId)?.runId;
  if (!runId) throw new Error("the demo project has no run to read");
  runPath = `/api/runs/${runId}`;
  stranger = await (await freshUser(db, "fast-read-stranger")).cookie();
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

describe("the two reads answered before Next agree with Next's answer", () => {
  it("signed out, or with a token nobody holds: 401, and the unknown token's cookie cleared", async () => {
    for (const path of [listPath, runPath]) {
      expect((await bothWays(path, {})).status).toBe(401);
      const unknown = await bothWays(path, { cookie: "pourline_session=not-a-session" });
      expect(unknown.status).toBe(401);
      expect(sessionCookieOf(unknown)).toEqual({ pair: "pourline_session=", maxAge: 0 });
    }
  });

  it("a member: the same tag, encoding and length gzipped and plain, and 304 for the tag held", async () => {
    for (const path of [listPath, runPath]) {
      const gzip = await bothWays(path, { cookie: member, "accept-encoding": "gzip" });
      expect(gzip.status).toBe(200);
      expect(gzip.headers["content-encoding"]).toBe("gzip");
      const plain = await bothWays(path, { cookie: member });
      expect(plain.status).toBe(200);
      expect(plain.headers["content-encoding"]).toBeUndefined();
      const again = await bothWays(path, { cookie: member, "accept-encoding": "gzip", "if-none-match": String(gzip.headers.etag) });
      expect(again.status).toBe(304);
    }
  });

  it("someone not in the project: 404, also when naming the current tag", async () => {
    const tag = String((await raw(runPath, { cookie: member })).headers.etag);
    for (const path of [listPath, runPath]) {
      expect((await bothWays(path, { cookie: stranger })).status).toBe(404);
      expect((await bothWays(path, { cookie: stranger, "if-none-match": tag })).status).toBe(404);
    }
    expect((await bothWays("/api/runs/not-a-run", { cookie: member })).status).toBe(404);
  });

  it("renews a session past half its idle time, and ends one past its absolute limit", async () => {
    const user = await freshUser(db, "fast-read-session");
    // Not a member of the demo project: the session is decided before access (404 for the stranger).
    const renewed = await newSession(user.email);
    const token = renewed.split("=")[1];
    await db`UPDATE sessions SET expires_at = now() + interval '5 hours' WHERE id = ${sha256(token)}`;
    const reply = await raw(runPath, { cookie: renewed });
    expect(reply.status).toBe(404);
    expect(sessionCookieOf(reply)?.pair).toBe(renewed);
    expect(sessionCookieOf(reply)!.maxAge).toBeGreaterThan(11 * 3600);
    const [row] = await db`SELECT extract(epoch FROM expires_at - now())::int AS secs FROM sessions WHERE id = ${sha256(token)}`;
    expect(row.secs).toBeGreaterThan(11 * 3600);

    const old = await newSession(user.email);
    const oldToken = old.split("=")[1];
    await db`UPDATE sessions SET created_at = now() - interval '7 days 1 minute', expires_at = now() + interval '11 hours' WHERE id = ${sha256(oldToken)}`;
    const ended = await raw(listPath, { cookie: old });
    expect(ended.status).toBe(401);
    expect(sessionCookieOf(ended)).toEqual({ pair: "pourline_session=", maxAge: 0 });
    expect((await db`SELECT count(*)::int AS n FROM sessions WHERE id = ${sha256(oldToken)}`)[0].n).toBe(0);
  });
});
