/**
 * One's own account over HTTP: name and title (bad ones named, nothing stored), the password change (the current
 * password checked and counted against the sign-in limit, every session of the account ended, this browser
 * signed in again, the new password the only one that works) and signing out everywhere else. Each test uses a
 * new account of its own, so no demo sign-in changes.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { call, DEMO_PASSWORD, signIn } from "../helpers/app";
import { newAccount } from "../helpers/authz-world";

let db: postgres.Sql;
beforeAll(() => {
  db = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
});
afterAll(async () => {
  await db.end();
});

const cookieFrom = (res: { headers: Headers }) => res.headers.get("set-cookie")!.split(";")[0];
/** A sign-in of its own each time (the helpers' signIn keeps one session per address): another browser. */
async function newBrowser(email: string): Promise<string> {
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password: DEMO_PASSWORD } });
  expect(res.status).toBe(200);
  return cookieFrom(res);
}
const stillSignedIn = async (cookie: string) => (await call("/api/auth/session", { cookie })).status === 200;

describe("name and title", () => {
  it("saves them, trimmed, and refuses an empty name or a control character naming the field", async () => {
    const me = await newAccount(db, "details");
    const cookie = await signIn(me.email);
    const ok = await call("/api/account", { method: "PUT", cookie, body: { name: "  Ines Okafor ", title: "Resident engineer" } });
    expect(ok.status).toBe(200);
    expect((await call("/api/auth/session", { cookie })).body.user).toMatchObject({ name: "Ines Okafor", title: "Resident engineer" });

    const empty = await call("/api/account", { method: "PUT", cookie, body: { name: " ", title: "" } });
    expect(empty.status).toBe(400);
    expect(empty.body.fields).toEqual([{ path: "name", label: "Name", message: "must not be empty" }]);
    const control = await call("/api/account", { method: "PUT", cookie, body: { name: "Ines", title: "bad\u0007title" } });
    expect(control.status).toBe(400);
    expect(control.body.fields.map((f: { path: string; label: string }) => `${f.path} ${f.label}`)).toEqual(["title Title"]);
    const extra = await call("/api/account", { method: "PUT", cookie, body: { name: "Ines", title: "", email: "other@example.test" } });
    expect(extra.status).toBe(400);
    const [row] = await db`SELECT name, title, email FROM users WHERE id = ${me.id}`;
    expect(row).toEqual({ name: "Ines Okafor", title: "Resident engineer", email: me.email });
  });
});

describe("changing the password", () => {
  const change = (cookie: string, currentPassword: string, newPassword = "a-brand-new-password", confirm = newPassword) =>
    call("/api/account/password", { method: "PUT", cookie, body: { currentPassword, newPassword, confirm } });

  it("ends every session of the account, signs this browser in again, and only the new password works", async () => {
    const me = await newAccount(db, "password");
    const here = await newBrowser(me.email);
    const elsewhere = await newBrowser(me.email);
    const res = await change(here, DEMO_PASSWORD);
    expect(res.status).toBe(200);
    expect(await stillSignedIn(elsewhere)).toBe(false);
    expect(await stillSignedIn(here)).toBe(false); // the old cookie of this browser too: it was given a new one
    expect(await stillSignedIn(cookieFrom(res))).toBe(true);
    expect((await call("/api/auth/signin", { method: "POST", body: { email: me.email, password: DEMO_PASSWORD } })).status).toBe(401);
    expect((await call("/api/auth/signin", { method: "POST", body: { email: me.email, password: "a-brand-new-password" } })).status).toBe(200);
  });

  it("refuses a new password that is short, unconfirmed or the same, naming each field, and changes nothing", async () => {
    const me = await newAccount(db, "rules");
    const cookie = await signIn(me.email);
    const [before] = await db`SELECT password_hash FROM users WHERE id = ${me.id}`;
    const short = await change(cookie, DEMO_PASSWORD, "short", "shorter");
    expect(short.status).toBe(400);
    expect(short.body.fields.map((f: { path: string; message: string }) => `${f.path}: ${f.message}`)).toEqual(["newPassword: must be at least 10 characters", "confirm: must match the new password"]);
    const same = await change(cookie, DEMO_PASSWORD, DEMO_PASSWORD);
    expect(same.body.fields.map((f: { path: string }) => f.path)).toEqual(["newPassword"]);
    const [after] = await db`SELECT password_hash FROM users WHERE id = ${me.id}`;
    expect(after.password_hash).toBe(before.password_hash);
    expect(await stillSignedIn(cookie)).toBe(true);
  });

  it("a wrong current password is named, counts against the sign-in limit, and the sixth try is refused without a check", async () => {
    const me = await newAccount(db, "guess");
    const cookie = await signIn(me.email);
    for (let i = 0; i < 5; i++) {
      const wrong = await change(cookie, `guess number ${i}`);
      expect(wrong.status).toBe(400);
      expect(wrong.body.fields).toEqual([{ path: "currentPassword", label: "Current password", message: "is not your current password" }]);
    }
    const locked = await change(cookie, DEMO_PASSWORD);
    expect(locked.status).toBe(429);
    expect(locked.body.error).toBe("Too many wrong passwords. Wait 15 minutes and try again.");
    // The same limit as signing in: the right password does not sign in either until the window passes.
    expect((await call("/api/auth/signin", { method: "POST", body: { email: me.email, password: DEMO_PASSWORD } })).status).toBe(429);
    expect(await stillSignedIn(cookie)).toBe(true);
  });
});

describe("signing out everywhere else", () => {
  it("ends the other sessions and keeps this browser signed in with a new one", async () => {
    const me = await newAccount(db, "sessions");
    const here = await newBrowser(me.email);
    const others = [await newBrowser(me.email), await newBrowser(me.email)];
    const res = await call("/api/account/sessions", { method: "DELETE", cookie: here });
    expect(res.status).toBe(200);
    expect(res.body.endedElsewhere).toBe(2);
    for (const o of others) expect(await stillSignedIn(o)).toBe(false);
    expect(await stillSignedIn(cookieFrom(res))).toBe(true);
    const [{ n }] = await db`SELECT count(*)::int AS n FROM sessions WHERE user_id = ${me.id}`;
    expect(n).toBe(1);
  });
});
