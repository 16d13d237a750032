/**
 * Sign-in limits hold under concurrency and cannot be dodged with a forged X-Forwarded-For. The test app
 * trusts one proxy address, 127.0.0.2 (POURLINE_TRUSTED_PROXIES, set by `npm test`); ordinary test requests
 * come from 127.0.0.1, and `fromProxy` connects from 127.0.0.2 to play the proxy.
 */
import { afterAll, describe, expect, it } from "vitest";
import { request } from "node:http";
import { randomUUID } from "node:crypto";
import { APP_URL } from "../helpers/app";
import { appDatabase, freshUser, FRESH_PASSWORD } from "../helpers/fresh-team";

const db = appDatabase();
afterAll(() => db.end());

/** A JSON POST from a chosen local source address, with optional X-Forwarded-For. */
function fromAddress(localAddress: string, path: string, body: unknown, xff?: string): Promise<number> {
  const url = new URL(path, APP_URL);
  const payload = JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = request(
      {
        host: "127.0.0.1",
        port: url.port,
        path: url.pathname,
        method: "POST",
        localAddress,
        headers: { "content-type": "application/json", origin: APP_URL, "content-length": Buffer.byteLength(payload), ...(xff ? { "x-forwarded-for": xff } : {}) },
      },
      (res) => {
        res.resume();
        res.on("end", () => resolve(res.statusCode ?? 0));
      },
    );
    req.on("error", reject);
    req.end(payload);
  });
}
const fromProxy = (path: string, body: unknown, xff: string) => fromAddress("127.0.0.2", path, body, xff);

async function failures(key: string): Promise<number | null> {
  const [row] = await db`SELECT failures FROM sign_in_attempts WHERE key = ${key}`;
  return row ? row.failures : null;
}

describe("sign-in limits", () => {
  it("40 parallel wrong passwords for one account: exactly 5 are checked, the rest refused unchecked", async () => {
    const user = await freshUser(db, "burst");
    // Through the trusted proxy with an address of its own, so this test's failures are not counted against
    // 127.0.0.1, from which every other test signs in.
    const statuses = await Promise.all(Array.from({ length: 40 }, () => fromProxy("/api/auth/signin", { email: user.email, password: "wrong-password-1" }, "198.51.100.40")));
    const checked = statuses.filter((s) => s === 401).length;
    expect(statuses.filter((s) => s !== 401 && s !== 429)).toEqual([]);
    expect(checked).toBe(5);
    // The database's count of reserved attempts is the number of passwords actually tried.
    expect(await failures(`account:${user.email}`)).toBe(checked);
    // Locked: even the right password is refused for the rest of the window.
    expect(await fromProxy("/api/auth/signin", { email: user.email, password: FRESH_PASSWORD }, "198.51.100.41")).toBe(429);
  });

  it("ignores X-Forwarded-For from a client that is not a trusted proxy", async () => {
    const forged = "198.51.100.222"; // an address no other test signs in from
    const status = await fromAddress("127.0.0.1", "/api/auth/signin", { email: `nobody.${randomUUID().slice(0, 8)}@hardening.example`, password: "x" }, forged);
    expect(status).toBe(401);
    expect(await failures(`address:${forged}`)).toBeNull();
    expect(await failures("address:127.0.0.1")).toBeGreaterThanOrEqual(1);
  });

  it("believes X-Forwarded-For from the trusted proxy", async () => {
    const client = "203.0.113.77";
    const before = (await failures(`address:${client}`)) ?? 0;
    expect(await fromProxy("/api/auth/signin", { email: `nobody.${randomUUID().slice(0, 8)}@hardening.example`, password: "x" }, `6.6.6.6, ${client}`)).toBe(401);
    expect(await failures(`address:${client}`)).toBe(before + 1);
    expect(await failures("address:6.6.6.6")).toBeNull();
  });

  it("a successful sign-in gives its address slot back", async () => {
    const user = await freshUser(db, "ok");
    const client = "203.0.113.78";
    expect(await fromProxy("/api/auth/signin", { email: user.email, password: FRESH_PASSWORD }, client)).toBe(200);
    expect(await failures(`address:${client}`)).toBe(0);
    expect(await failures(`account:${user.email}`)).toBeNull();
  });

  it("password-reset requests are limited the same way under concurrency", async () => {
    const user = await freshUser(db, "resetburst");
    const statuses = await Promise.all(Array.from({ length: 12 }, () => fromProxy("/api/auth/password-reset", { email: user.email }, "198.51.100.42")));
    expect(statuses.filter((s) => s === 200)).toHaveLength(3);
    expect(statuses.filter((s) => s === 429)).toHaveLength(9);
    expect((await db`SELECT count(*)::int AS n FROM password_resets WHERE user_id = ${user.id}`)[0].n).toBe(3);
  });
});
