/**
 * Sessions are stored hashed and live 12 h idle (renewed while used) and 7 days at most; the app's database
 * role is no superuser; and no route that changes roles can leave a project without an administrator.
 */
import { afterAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { call } from "../helpers/app";
import { appDatabase, freshTeam, freshUser, FRESH_PASSWORD } from "../helpers/fresh-team";

const db = appDatabase();
afterAll(() => db.end());
const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

async function signInFresh(email: string) {
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password: FRESH_PASSWORD } });
  expect(res.status).toBe(200);
  const setCookie = res.headers.get("set-cookie") ?? "";
  return { cookie: setCookie.split(";")[0], token: setCookie.split(";")[0].split("=")[1], setCookie };
}

describe("sessions", () => {
  it("the database keeps only the SHA-256 of the cookie's token, and the cookie lasts 12 h", async () => {
    const user = await freshUser(db, "session");
    const { token, setCookie } = await signInFresh(user.email);
    expect(Buffer.from(token, "base64url").length).toBe(32);
    expect((await db`SELECT count(*)::int AS n FROM sessions WHERE id = ${token}`)[0].n).toBe(0);
    const [row] = await db`SELECT extract(epoch FROM expires_at - now())::int AS secs FROM sessions WHERE id = ${sha256(token)} AND user_id = ${user.id}`;
    expect(Math.abs(row.secs - 12 * 3600)).toBeLessThan(60);
    const maxAge = Number(/Max-Age=(\d+)/i.exec(setCookie)?.[1]);
    expect(Math.abs(maxAge - 12 * 3600)).toBeLessThan(60);
    expect(setCookie).toMatch(/HttpOnly/i);
  });

  it("is renewed while in use (sliding) and refreshes the cookie", async () => {
    const user = await freshUser(db, "sliding");
    const { cookie, token } = await signInFresh(user.email);
    await db`UPDATE sessions SET expires_at = now() + interval '5 hours' WHERE id = ${sha256(token)}`;
    const res = await call("/api/auth/session", { cookie });
    expect(res.status).toBe(200);
    expect(res.headers.get("set-cookie") ?? "").toContain(token);
    const [row] = await db`SELECT extract(epoch FROM expires_at - now())::int AS secs FROM sessions WHERE id = ${sha256(token)}`;
    expect(row.secs).toBeGreaterThan(11 * 3600);
  });

  it("ends after its idle time, and after 7 days however often it was renewed", async () => {
    const user = await freshUser(db, "absolute");
    const idle = await signInFresh(user.email);
    await db`UPDATE sessions SET expires_at = now() - interval '1 minute' WHERE id = ${sha256(idle.token)}`;
    expect((await call("/api/auth/session", { cookie: idle.cookie })).status).toBe(401);

    const old = await signInFresh(user.email);
    await db`UPDATE sessions SET created_at = now() - interval '7 days 1 minute', expires_at = now() + interval '11 hours' WHERE id = ${sha256(old.token)}`;
    expect((await call("/api/auth/session", { cookie: old.cookie })).status).toBe(401);
    expect((await db`SELECT count(*)::int AS n FROM sessions WHERE id = ${sha256(old.token)}`)[0].n).toBe(0);
  });
});

describe("the app's database role", () => {
  it("is not a superuser and owns the app's tables", async () => {
    const [me] = await db`SELECT current_user AS name, rolsuper, rolcreaterole, rolcreatedb FROM pg_roles WHERE rolname = current_user`;
    expect(me).toMatchObject({ name: "pourline_app", rolsuper: false, rolcreaterole: false, rolcreatedb: false });
    const foreign = await db`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tableowner <> current_user`;
    expect(foreign).toEqual([]);
  });
});

describe("every role change keeps an administrator", () => {
  const roleOf = async (projectId: string, userId: string) => (await db`SELECT role FROM project_members WHERE project_id = ${projectId} AND user_id = ${userId}`)[0]?.role ?? null;
  const admins = async (projectId: string) => (await db`SELECT count(*)::int AS n FROM project_members WHERE project_id = ${projectId} AND role = 'admin'`)[0].n;

  it("the add-member route cannot demote the last administrator", async () => {
    const { projectId, members } = await freshTeam(db, ["admin", "engineer"]);
    const [admin] = members;
    const res = await call(`/api/projects/${projectId}/members`, { method: "POST", cookie: await admin.cookie(), body: { email: admin.email, role: "viewer" } });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/at least one administrator/);
    expect(await roleOf(projectId, admin.id)).toBe("admin");
  });

  it("the remove-member route cannot remove the last administrator", async () => {
    const { projectId, members } = await freshTeam(db, ["admin", "viewer"]);
    const [admin] = members;
    const res = await call(`/api/projects/${projectId}/members/${admin.id}`, { method: "DELETE", cookie: await admin.cookie() });
    expect(res.status).toBe(409);
    expect(await roleOf(projectId, admin.id)).toBe("admin");
  });

  it("with two administrators, one may step down; then the other may not", async () => {
    const { projectId, members } = await freshTeam(db, ["admin", "admin"]);
    const [a, b] = members;
    expect((await call(`/api/projects/${projectId}/members`, { method: "POST", cookie: await a.cookie(), body: { email: a.email, role: "engineer" } })).status).toBe(201);
    expect(await roleOf(projectId, a.id)).toBe("engineer");
    expect((await call(`/api/projects/${projectId}/members/${b.id}`, { method: "DELETE", cookie: await b.cookie() })).status).toBe(409);
    expect(await admins(projectId)).toBe(1);
  });

  it("two administrators demoting each other at once leave one administrator", async () => {
    for (let round = 0; round < 3; round++) {
      const { projectId, members } = await freshTeam(db, ["admin", "admin"]);
      const [a, b] = members;
      const [ca, cb] = [await a.cookie(), await b.cookie()];
      const results = await Promise.all([
        call(`/api/projects/${projectId}/members`, { method: "POST", cookie: ca, body: { email: b.email, role: "viewer" } }),
        call(`/api/projects/${projectId}/members/${a.id}`, { method: "DELETE", cookie: cb }),
      ]);
      // Whichever runs second is refused: as last admin (409) or, having lost its own admin role, as 403/404.
      expect(results.filter((r) => r.status < 300)).toHaveLength(1);
      expect(await admins(projectId)).toBe(1);
    }
  });
});
