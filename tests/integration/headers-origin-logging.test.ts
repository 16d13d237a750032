/**
 * Security headers on pages and API answers, the full-origin check (API routes and server actions alike
 * answer 403 with a plain message), and failed queries logged as a code and a reference — never their values.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { inspect } from "node:util";
import { randomUUID } from "node:crypto";
import { sql } from "drizzle-orm";
import { APP_URL, call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { appDatabase } from "../helpers/fresh-team";
import { refuseRows } from "../helpers/refuse-rows";
import { createPool } from "../../db/client";

const db = appDatabase();
const appLog = process.env.POURLINE_APP_LOG;
if (!appLog) throw new Error("POURLINE_APP_LOG is not set: run through `npm test`, which records the app's output there.");
const PROBE = "log-probe-";

let allowScenarios: () => Promise<void>;
beforeAll(async () => {
  allowScenarios = await refuseRows(db, { name: "scenario", table: "scenarios", on: "INSERT", when: `NEW.name LIKE '${PROBE}%'` });
});
afterAll(async () => {
  await allowScenarios?.();
  await db.end();
});

describe("security headers", () => {
  it.each(["/signin", "/reset/some-token-value-0123456789", "/invite/some-token-value-0123456789", "/shared/some-token-value-0123456789", "/api/auth/session"])("%s", async (path) => {
    const res = await call(path);
    expect(res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    // The test app runs the production build.
    expect(res.headers.get("strict-transport-security")).toMatch(/max-age=\d+/);
  });
});

describe("script nonces", () => {
  const nonceOf = (csp: string | null) => /script-src 'self' 'nonce-([A-Za-z0-9+/=]+)' 'strict-dynamic'/.exec(csp ?? "")?.[1];

  it.each(["/signin", "/reset", "/projects", "/no-such-page"])("%s: every script of the page carries the nonce of its own answer, fresh per request", async (path) => {
    const cookie = path === "/projects" ? await signInAs("viewer") : undefined;
    const seen: string[] = [];
    for (let i = 0; i < 2; i++) {
      const res = await call(path, { cookie });
      const nonce = nonceOf(res.headers.get("content-security-policy"));
      expect(nonce, `${path}: ${res.headers.get("content-security-policy")}`).toBeTruthy();
      const html = String(res.body);
      const scripts = html.match(/<script\b[^>]*>/g) ?? [];
      expect(scripts.length).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag, path).toContain(`nonce="${nonce}"`);
      seen.push(nonce!);
    }
    expect(seen[0]).not.toBe(seen[1]);
  });

  it("an API answer allows no script at all beyond this origin's files (no nonce, no inline)", async () => {
    const res = await call("/api/auth/session");
    const directives = (res.headers.get("content-security-policy") ?? "").split("; ");
    expect(directives.find((d) => d.startsWith("script-src"))).toBe("script-src 'self'");
  });
});

describe("origin check", () => {
  const port = new URL(APP_URL).port;
  it.each([`https://localhost:${port}`, `http://localhost:${Number(port) + 1}`, "http://evil.example", null])("a POST from %s is refused with 403", async (origin) => {
    const res = await call("/api/auth/signin", { method: "POST", origin, body: { email: "x@example.com", password: "y" } });
    expect(res.status).toBe(403);
    expect(res.body).toMatchObject({ code: "forbidden", error: expect.stringMatching(/did not come from Pourline/) });
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
  });

  it("a server action from a foreign origin answers 403, not 500", async () => {
    const res = await fetch(`${APP_URL}/signin`, {
      method: "POST",
      headers: { origin: "https://evil.example", "next-action": "0".repeat(40), "content-type": "text/plain;charset=UTF-8" },
      body: "[]",
      redirect: "manual",
    });
    expect(res.status).toBe(403);
    expect((await res.json()).code).toBe("forbidden");
  });
});

describe("failed queries in the log", () => {
  it("a failing insert logs a code and a reference, not the session or the scenario body", async () => {
    const admin = await signInAs("admin");
    const projectId = (await kestrelProject(admin)).id;
    const marker = `secret-body-${randomUUID()}`;
    const definition = { ...(await demoDefinition(admin, projectId)), name: `${PROBE}${marker}`, description: marker };
    const logBefore = readFileSync(appLog, "utf8").length;
    const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: admin, body: { name: `${PROBE}${marker}`, definition } });
    expect(res.status).toBe(500);
    expect(res.body.ref).toMatch(/^[0-9a-f]{12}$/);
    expect(res.body.error).toContain(res.body.ref);

    await expect.poll(() => readFileSync(appLog, "utf8").slice(logBefore), { timeout: 5_000 }).toContain(res.body.ref);
    const logged = readFileSync(appLog, "utf8").slice(logBefore);
    expect(logged).toContain("P0001"); // the SQLSTATE of RAISE EXCEPTION
    expect(logged).not.toContain(marker);
    expect(logged).not.toContain(admin.split("=")[1]);
    expect(logged).not.toMatch(/params:|Failed query/);
  });

  it("a driver error carries no parameter, in its message or anywhere inspect() can see", async () => {
    const pool = createPool(process.env.DATABASE_URL!, 1);
    const sessionKey = `session-key-${randomUUID()}`;
    try {
      const error = await pool.db.execute(sql`INSERT INTO sessions (id, user_id, expires_at) VALUES (${sessionKey}, ${"no-such-user"}, now())`).then(
        () => null,
        (e: unknown) => e,
      );
      expect(error).toBeInstanceOf(Error);
      expect((error as { code: string }).code).toBe("23503");
      expect(inspect(error, { depth: 5, showHidden: true })).not.toContain(sessionKey);
      expect(inspect(error, { depth: 5, showHidden: true })).not.toContain("no-such-user");
    } finally {
      await pool.sql.end();
    }
  });
});
