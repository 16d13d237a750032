/**
 * The local mail catcher page (/dev/mailbox) shows a signed-in person only mail addressed to them: nobody —
 * not a project administrator either — can read another person's reset or invitation link there.
 * (It exists at all only with POURLINE_DEV_MAILBOX=1 and POURLINE_FAKE_SMTP=1: tests/unit/http-guards.test.ts.)
 */
import { afterAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { appDatabase, freshUser } from "../helpers/fresh-team";
import { findMail } from "../../src/lib/server/mailbox";

const db = appDatabase();
afterAll(() => db.end());

const waitForMail = (to: string, subject: string) => expect.poll(() => findMail({ to, subject }), { timeout: 20_000, interval: 250 }).not.toBeNull();

describe("dev mailbox page", () => {
  it("shows each person their own mail and nobody else's reset or invitation links", async () => {
    const [victim, other] = [await freshUser(db, "victim"), await freshUser(db, "other")];
    expect((await call("/api/auth/password-reset", { method: "POST", body: { email: victim.email } })).status).toBe(200);
    await waitForMail(victim.email, "Reset");

    const admin = await signInAs("admin");
    const invitee = `invitee.${randomUUID().slice(0, 8)}@hardening.example`;
    expect((await call(`/api/projects/${(await kestrelProject(admin)).id}/invitations`, { method: "POST", cookie: admin, body: { email: invitee, role: "viewer" } })).status).toBe(201);
    await waitForMail(invitee, "invited");

    for (const cookie of [admin, await other.cookie()]) {
      const page = await call("/dev/mailbox", { cookie });
      expect(page.status).toBe(200);
      expect(page.body).not.toContain(victim.email);
      expect(page.body).not.toContain(invitee);
      expect(page.body).not.toMatch(/\/reset\/[A-Za-z0-9_-]{20,}/);
      expect(page.body).not.toMatch(/\/invite\/[A-Za-z0-9_-]{20,}/);
    }

    const own = await call("/dev/mailbox", { cookie: await victim.cookie() });
    expect(own.status).toBe(200);
    expect(own.body).toContain(victim.email);
    expect(own.body).toMatch(/href="http:\/\/[^"]+\/reset\//);
    expect(own.body).toContain('data-testid="outbox-table"');
  });

  it("is not there for someone signed out", async () => {
    expect((await call("/dev/mailbox")).status).not.toBe(200);
  });
});
