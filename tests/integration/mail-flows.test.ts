/**
 * E-mail flows over HTTP against the running app and its fake SMTP store: password reset end to end, the
 * same answer for unknown accounts, invitations and share links written atomically with their e-mails.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { createHash, randomUUID } from "node:crypto";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { refuseRows } from "../helpers/refuse-rows";
import { hashPassword } from "../../src/lib/server/password";
import { findMail, linkIn, type CaughtMessage } from "../../src/lib/server/mailbox";

if (!process.env.POURLINE_MAILBOX_DIR) throw new Error("POURLINE_MAILBOX_DIR is not set: run through `npm test`, which starts the fake SMTP server.");

// The app's own database: to create a throwaway account, age links and make one insert fail on purpose.
const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");
/** Addresses with this prefix make the outbox insert fail (trigger below); nobody else uses it. */
const REFUSED = "outbox-refuses-";

async function waitForMail(to: string, subject: string): Promise<CaughtMessage> {
  // The app's poller runs every 2 s; 20 s is ten passes.
  await expect.poll(() => findMail({ to, subject }), { timeout: 20_000, interval: 250 }).not.toBeNull();
  return findMail({ to, subject })!;
}

async function signInCookie(email: string, password: string): Promise<string | null> {
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password } });
  return res.status === 200 ? (res.headers.get("set-cookie") ?? "").split(";")[0] : null;
}

const tokenOf = (link: string) => new URL(link).pathname.split("/").pop()!;

let allowOutbox: () => Promise<void>;
beforeAll(async () => {
  allowOutbox = await refuseRows(appDb, { name: "outbox", table: "email_outbox", on: "INSERT", when: `NEW.to_address LIKE '${REFUSED}%'` });
});
afterAll(async () => {
  await allowOutbox?.();
  await appDb.end();
});

describe("password reset", () => {
  const email = `reset.${randomUUID().slice(0, 8)}@marrin-dot.example`;
  const oldPassword = "old-password-123";
  const newPassword = "a-new-password-456";

  beforeAll(async () => {
    await appDb`INSERT INTO users (id, email, name, password_hash) VALUES (${randomUUID()}, ${email}, 'Reset Tester', ${await hashPassword(oldPassword)})`;
  });

  it("request → e-mail → new password → old sessions end → sign in with the new one", async () => {
    const [laptop, phone] = [await signInCookie(email, oldPassword), await signInCookie(email, oldPassword)];
    expect(laptop).toBeTruthy();
    expect((await call("/api/auth/session", { cookie: phone })).status).toBe(200);

    const req = await call("/api/auth/password-reset", { method: "POST", body: { email } });
    expect(req.status).toBe(200);
    const mail = await waitForMail(email, "Reset your Pourline password");
    const link = linkIn(mail, "/reset/");
    expect(link).toBeTruthy();
    const token = tokenOf(link!);
    expect(Buffer.from(token, "base64url").length * 8).toBe(256);
    // Stored only as its hash, with a one-hour expiry.
    const [stored] = await appDb`SELECT extract(epoch FROM expires_at - created_at)::int AS secs FROM password_resets WHERE token_hash = ${sha256(token)}`;
    expect(Math.abs(stored.secs - 3_600)).toBeLessThanOrEqual(2);
    expect((await appDb`SELECT count(*)::int AS n FROM password_resets WHERE token_hash = ${token}`)[0].n).toBe(0);

    const page = await call(new URL(link!).pathname);
    expect(page.status).toBe(200);
    expect(page.body).toContain("Choose a new password");
    expect(page.body).not.toContain('data-testid="reset-problem"');

    const tooShort = await call("/api/auth/password-reset/confirm", { method: "POST", body: { token, password: "short" } });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.fields[0].path).toBe("password");

    const done = await call("/api/auth/password-reset/confirm", { method: "POST", body: { token, password: newPassword } });
    expect(done.status).toBe(200);
    const fresh = (done.headers.get("set-cookie") ?? "").split(";")[0];
    expect((await call("/api/auth/session", { cookie: fresh })).status).toBe(200);

    // Every earlier session of the account has ended.
    expect((await call("/api/auth/session", { cookie: laptop })).status).toBe(401);
    expect((await call("/api/auth/session", { cookie: phone })).status).toBe(401);
    expect(await signInCookie(email, oldPassword)).toBeNull();
    expect(await signInCookie(email, newPassword)).toBeTruthy();

    // Single use.
    const again = await call("/api/auth/password-reset/confirm", { method: "POST", body: { token, password: "yet-another-password" } });
    expect(again.status).toBe(404);
    expect(again.body.error).toMatch(/already been used/);
    expect((await call(new URL(link!).pathname)).body).toContain("already been used");
    expect(await signInCookie(email, newPassword)).toBeTruthy();
  });

  it("an expired reset link is refused and changes nothing", async () => {
    expect((await call("/api/auth/password-reset", { method: "POST", body: { email } })).status).toBe(200);
    // The second reset e-mail to this address: wait until there are two.
    await expect.poll(async () => (await appDb`SELECT count(*)::int AS n FROM email_outbox WHERE to_address = ${email} AND status = 'sent'`)[0].n, { timeout: 20_000 }).toBe(2);
    const token = tokenOf(linkIn(findMail({ to: email, subject: "Reset" })!, "/reset/")!);
    await appDb`UPDATE password_resets SET expires_at = now() - interval '1 minute' WHERE token_hash = ${sha256(token)}`;
    const res = await call("/api/auth/password-reset/confirm", { method: "POST", body: { token, password: "expired-link-password" } });
    expect(res.status).toBe(404);
    expect(res.body.error).toMatch(/expired/);
    expect(await signInCookie(email, "expired-link-password")).toBeNull();
  });

  it("an unknown e-mail gets the same 200 answer and no e-mail", async () => {
    const known = await call("/api/auth/password-reset", { method: "POST", body: { email: "director@marrin-dot.example" } });
    const nobody = `nobody.${randomUUID().slice(0, 8)}@marrin-dot.example`;
    const unknown = await call("/api/auth/password-reset", { method: "POST", body: { email: nobody } });
    expect(unknown.status).toBe(200);
    expect(unknown.body).toEqual(known.body);
    // Every e-mail goes through the outbox, written before the answer: nothing was queued for this address.
    expect((await appDb`SELECT count(*)::int AS n FROM email_outbox WHERE to_address = ${nobody}`)[0].n).toBe(0);
    expect((await appDb`SELECT count(*)::int AS n FROM email_outbox WHERE to_address = 'director@marrin-dot.example'`)[0].n).toBeGreaterThanOrEqual(1);
    await new Promise((r) => setTimeout(r, 3_000)); // more than one poller pass
    expect(findMail({ to: nobody })).toBeNull();
  });

  it("is rate-limited per address asked about, known or not", async () => {
    const nobody = `limit.${randomUUID().slice(0, 8)}@marrin-dot.example`;
    const statuses = [];
    for (let i = 0; i < 4; i++) statuses.push((await call("/api/auth/password-reset", { method: "POST", body: { email: nobody } })).status);
    expect(statuses).toEqual([200, 200, 200, 429]);
  });
});

describe("invitations", () => {
  let admin: string;
  let projectId: string;
  beforeAll(async () => {
    admin = await signInAs("admin");
    projectId = (await kestrelProject(admin)).id;
  });

  it("only an administrator may invite; a member already on the project is refused", async () => {
    const engineer = await signInAs("engineer");
    expect((await call(`/api/projects/${projectId}/invitations`, { method: "POST", cookie: engineer, body: { email: "x@marrin-dot.example", role: "viewer" } })).status).toBe(403);
    expect((await call(`/api/projects/${projectId}/invitations`, { method: "POST", body: { email: "x@marrin-dot.example", role: "viewer" } })).status).toBe(401);
    const dup = await call(`/api/projects/${projectId}/invitations`, { method: "POST", cookie: admin, body: { email: "Engineer@marrin-dot.example", role: "viewer" } });
    expect(dup.status).toBe(409);
    expect(dup.body.fields[0].path).toBe("email");
  });

  it("writes the invitation and its e-mail together; the token is only in the e-mail, hashed in the table", async () => {
    const email = `invitee.${randomUUID().slice(0, 8)}@marrin-dot.example`;
    const res = await call(`/api/projects/${projectId}/invitations`, { method: "POST", cookie: admin, body: { email, role: "viewer" } });
    expect(res.status).toBe(201);
    const [inv] = await appDb`SELECT token_hash, role::text, used_at FROM invitations WHERE email = ${email}`;
    expect(inv.role).toBe("viewer");
    expect(inv.used_at).toBeNull();
    const queued = await appDb`SELECT text_body FROM email_outbox WHERE to_address = ${email}`;
    expect(queued).toHaveLength(1);
    const token = tokenOf(queued[0].text_body.match(/https?:\/\/\S+\/invite\/\S+/)[0]);
    expect(sha256(token)).toBe(inv.token_hash);
    expect(JSON.stringify(res.body)).not.toContain(token);
    const mail = await waitForMail(email, "invited");
    expect(linkIn(mail, "/invite/")).toContain(token);
    // Seven days, to the second.
    const [{ secs }] = await appDb`SELECT extract(epoch FROM expires_at - created_at)::int AS secs FROM invitations WHERE email = ${email}`;
    expect(Math.abs(secs - 7 * 86_400)).toBeLessThanOrEqual(2);

    const page = await call(`/invite/${token}`);
    expect(page.body).toMatch(/Join .*Kestrel Bay Causeway/);
    await appDb`UPDATE invitations SET expires_at = now() - interval '1 minute' WHERE email = ${email}`;
    expect((await call(`/invite/${token}`)).body).toContain("has expired");
    expect((await call(`/invite/${"x".repeat(43)}`)).body).toContain("is not valid");
  });

  it("when the e-mail insert fails, neither the invitation nor an e-mail is left", async () => {
    const email = `${REFUSED}${randomUUID().slice(0, 8)}@marrin-dot.example`;
    const res = await call(`/api/projects/${projectId}/invitations`, { method: "POST", cookie: admin, body: { email, role: "inspector" } });
    expect(res.status).toBe(500);
    expect((await appDb`SELECT count(*)::int AS n FROM invitations WHERE email = ${email}`)[0].n).toBe(0);
    expect((await appDb`SELECT count(*)::int AS n FROM email_outbox WHERE to_address = ${email}`)[0].n).toBe(0);
  });
});

describe("share links by e-mail", () => {
  let scheduler: string;
  let scenarioId: string;
  beforeAll(async () => {
    scheduler = await signInAs("scheduler");
    const projectId = (await kestrelProject(scheduler)).id;
    scenarioId = (await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler })).body.scenarios[0].id;
  });

  it("e-mails the new link to each address; the link in the e-mail opens the shared scenario", async () => {
    const to = [`pio.${randomUUID().slice(0, 8)}@county.example`, `consultant.${randomUUID().slice(0, 8)}@firm.example`];
    const res = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 5, label: "mail test", emailTo: to } });
    expect(res.status).toBe(201);
    expect(res.body.emailedTo).toEqual(to);
    for (const address of to) {
      const mail = await waitForMail(address, "Scenario shared with you");
      const link = linkIn(mail, "/shared/");
      expect(link).toContain(res.body.token);
      expect((await call(`/api/shared/${tokenOf(link!)}`)).status).toBe(200);
    }
  });

  it("more than 10 addresses, or a malformed one, is 400 naming the field", async () => {
    const many = Array.from({ length: 11 }, (_, i) => `p${i}@county.example`);
    const tooMany = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 5, emailTo: many } });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.fields[0].path).toBe("emailTo");
    const bad = await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 5, emailTo: ["ok@county.example", "not-an-address"] } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].path).toBe("emailTo[1]");
  });

  it("when an e-mail cannot be queued, the link is not created either", async () => {
    const label = `atomic ${randomUUID()}`;
    const res = await call(`/api/scenarios/${scenarioId}/share-links`, {
      method: "POST",
      cookie: scheduler,
      body: { expiresInDays: 5, label, emailTo: ["fine@county.example", `${REFUSED}x@county.example`] },
    });
    expect(res.status).toBe(500);
    expect((await appDb`SELECT count(*)::int AS n FROM share_links WHERE label = ${label}`)[0].n).toBe(0);
    expect((await appDb`SELECT count(*)::int AS n FROM email_outbox WHERE subject LIKE 'Scenario shared%' AND text_body LIKE ${"%" + label + "%"}`)[0].n).toBe(0);
  });
});
