/**
 * One's own account in Debian's Chromium: a new account's holder opens Your account from their name in the header,
 * leaves the name empty and is told so beside the field, saves a name and title (the header shows them), changes
 * the password after one wrong try (named beside "Current password"), and is still signed in here while another
 * browser's session has ended. No serious axe finding on the page.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { APP_URL, DEMO_PASSWORD, call, signIn } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { newAccount } from "../helpers/authz-world";
import { SignInPage } from "./pages/sign-in";

const browser = browserPerFile();
let db: postgres.Sql;
beforeAll(async () => {
  db = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
});
afterAll(async () => {
  await db?.end();
});

describe("your account", () => {
  it("changes the name, the title and the password, and signs out the other browser", async () => {
    const me = await newAccount(db, "e2e-account");
    const otherBrowser = await signIn(me.email);
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await new SignInPage(page).signIn(me.email);
    await page.waitForURL(`${APP_URL}/projects`);

    await page.getByRole("link", { name: /Your account/ }).click();
    await page.waitForURL(`${APP_URL}/account`);
    await page.getByRole("heading", { name: "Your account", level: 1 }).waitFor();
    expect(await page.getByTestId("other-sessions").textContent()).toContain("1 other browser is signed in");
    expect(await page.getByRole("button", { name: "Sign out everywhere else" }).count()).toBe(1);

    await page.getByLabel("Name", { exact: true }).fill("");
    await page.getByRole("button", { name: "Save name and title" }).click();
    await expect.poll(() => page.locator("#account-name-error").textContent()).toBe("Name must not be empty");
    await page.getByLabel("Name", { exact: true }).fill("Ines Okafor");
    await page.getByLabel("Title (optional)").fill("Resident engineer");
    await page.getByRole("button", { name: "Save name and title" }).click();
    await page.getByText("Saved.", { exact: true }).waitFor();
    await expect.poll(() => page.getByTestId("signed-in-name").textContent()).toBe("Ines Okafor");
    expect(await page.getByRole("banner").getByText("Resident engineer").count()).toBe(1);

    await page.getByLabel("Current password").fill("not my password");
    await page.getByLabel("New password", { exact: true }).fill("a-brand-new-password");
    await page.getByLabel("New password again").fill("a-brand-new-password");
    await page.getByRole("button", { name: "Change password" }).click();
    await expect.poll(() => page.locator("#account-currentPassword-error").textContent()).toBe("Current password is not your current password");
    await page.getByLabel("Current password").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Change password" }).click();
    await page.getByText("Password changed. Other sessions are signed out.").waitFor();
    await expect.poll(() => page.getByTestId("other-sessions").textContent()).toContain("Only here");
    // Nobody else is signed in: no button that would do nothing.
    expect(await page.getByRole("button", { name: "Sign out everywhere else" }).count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "account");

    // This browser is still signed in (with its new session); the other one is not.
    await page.reload();
    await page.getByRole("heading", { name: "Your account", level: 1 }).waitFor();
    expect(await page.getByTestId("other-sessions").textContent()).toContain("Only here");
    expect((await call("/api/auth/session", { cookie: otherBrowser })).status).toBe(401);
    await context.close();
  });
});
