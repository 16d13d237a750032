/**
 * An administrator invites a new person by e-mail from the members page; the message reaches the fake SMTP
 * store; the person opens the link in a fresh browser, sets a password, lands signed in on the project list
 * with the role they were invited with; the link then no longer works.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL, DEMO_PASSWORD, call, demoEmail, kestrelProject, signInAs } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { SignInPage, signedIn } from "./pages/sign-in";
import { findMail, linkIn } from "../../src/lib/server/mailbox";

const INVITEE = "new.person@marrin-dot.example";
const browser = browserPerFile();
beforeAll(async () => {
  if (!process.env.POURLINE_MAILBOX_DIR) throw new Error("POURLINE_MAILBOX_DIR is not set: run through `npm test`.");
});

describe("invitation by e-mail", () => {
  it("invite on the members page → e-mail → set a password → signed in as Inspector on Kestrel; the link is then spent", async () => {
    const projectId = (await kestrelProject(await signInAs("admin"))).id;

    // The administrator sends the invitation.
    const { context: adminContext, page: adminPage } = await signedIn(browser(), "admin");
    await adminPage.goto(`${APP_URL}/projects/${projectId}/members`);
    await adminPage.getByLabel("E-mail to invite").fill(INVITEE);
    await adminPage.getByLabel("Their role").selectOption("inspector");
    await adminPage.getByRole("button", { name: "Send invitation" }).click();
    await expect.poll(() => adminPage.getByRole("status").textContent()).toContain(`Invitation sent to ${INVITEE}`);
    await expect.poll(() => adminPage.getByTestId("pending-invitations").textContent()).toContain(INVITEE);
    await screenshot(adminPage, "members-invite");
    expect(await seriousA11yViolations(adminPage)).toEqual([]);
    await adminContext.close();

    // The message arrives in the fake SMTP store (the outbox poller runs every 2 s).
    await expect.poll(() => findMail({ to: INVITEE, subject: "invited" }), { timeout: 20_000, interval: 250 }).not.toBeNull();
    const mail = findMail({ to: INVITEE, subject: "invited" })!;
    expect(mail.subject).toContain("Kestrel");
    expect(mail.text).toContain("Inspector");
    const link = linkIn(mail, "/invite/")!;
    expect(link.startsWith(`${APP_URL}/invite/`)).toBe(true);

    // The invitee, in a browser that has never signed in.
    const inviteeContext = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await inviteeContext.newPage();
    await page.goto(link);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^Join .*Kestrel Bay Causeway/);
    expect(await page.getByTestId("role-badge").textContent()).toBe("Inspector");
    expect(await page.getByTestId("invite-email").textContent()).toBe(INVITEE);
    expect(await seriousA11yViolations(page)).toEqual([]);

    // Mismatched passwords are refused with the field named; nothing is created.
    await page.getByLabel("Your name").fill("Noor Halvorsen");
    await page.getByLabel("New password", { exact: true }).fill("tidewater-2031");
    await page.getByLabel("New password again").fill("tidewater-2013");
    await page.getByRole("button", { name: "Create account and join" }).click();
    await expect.poll(() => page.locator("#confirm-error").textContent()).toContain("must match");
    await screenshot(page, "invite-accept-error");
    // The name survives the refusal; the passwords are asked for again.
    expect(await page.getByLabel("Your name").inputValue()).toBe("Noor Halvorsen");

    await page.getByLabel("New password", { exact: true }).fill("tidewater-2031");
    await page.getByLabel("New password again").fill("tidewater-2031");
    await page.getByRole("button", { name: "Create account and join" }).click();
    await page.waitForURL(`${APP_URL}/projects`);
    await expect.poll(() => page.getByTestId("signed-in-name").textContent()).toBe("Noor Halvorsen");
    const card = page.getByRole("link", { name: /Kestrel Bay Causeway — deck overlay/ });
    expect(await card.getByTestId("role-badge").textContent()).toBe("Inspector");
    expect(await page.getByText("Tern Point").count()).toBe(0);
    await screenshot(page, "invite-accepted-projects");
    await inviteeContext.close();

    // The link is single use: a second visit shows why it no longer works and offers no form.
    const later = await browser().newContext();
    const again = await later.newPage();
    await again.goto(link);
    await expect.poll(() => again.getByTestId("invite-problem").textContent()).toContain("already been used");
    expect(await again.getByRole("button", { name: "Create account and join" }).count()).toBe(0);
    await screenshot(again, "invite-used");
    await later.close();

    // And the new password works for a normal sign-in.
    const signInContext = await browser().newContext();
    const signIn = await signInContext.newPage();
    await new SignInPage(signIn).signIn(INVITEE, "tidewater-2031");
    await signIn.waitForURL(`${APP_URL}/projects`);
    await signInContext.close();
  });

  it("someone who already has an account signs in on the invite page and gains the membership", async () => {
    const admin = await signInAs("admin");
    const tern = (await call("/api/projects", { cookie: admin })).body.projects.find((p: { name: string }) => p.name.includes("Tern Point"));
    const engineer = demoEmail("engineer");
    const res = await call(`/api/projects/${tern.id}/invitations`, { method: "POST", cookie: admin, body: { email: engineer, role: "engineer" } });
    expect(res.status).toBe(201);
    await expect.poll(() => findMail({ to: engineer, subject: "Tern Point" }), { timeout: 20_000, interval: 250 }).not.toBeNull();
    const link = linkIn(findMail({ to: engineer, subject: "Tern Point" })!, "/invite/")!;

    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await page.goto(link);
    await expect.poll(() => page.getByText("already has a Pourline account").count()).toBe(1);
    expect(await page.getByLabel("Your name").count()).toBe(0);
    // A wrong password is refused like any sign-in and joins nothing.
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in and join" }).click();
    await expect.poll(() => page.getByText("do not match").count()).toBe(1);
    await page.getByLabel("Password").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in and join" }).click();
    await page.waitForURL(`${APP_URL}/projects`);
    expect(await page.getByRole("link", { name: /Tern Point/ }).getByTestId("role-badge").textContent()).toBe("Engineer");
    await context.close();

    // Leave the seeded memberships as other test files expect them.
    const members = (await call(`/api/projects/${tern.id}/members`, { cookie: admin })).body.members as { userId: string; email: string }[];
    const added = members.find((m) => m.email === engineer)!;
    expect((await call(`/api/projects/${tern.id}/members/${added.userId}`, { method: "DELETE", cookie: admin })).status).toBe(200);
  });
});
