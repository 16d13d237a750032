/** A scheduler signs in, finds the project and its scenarios; a wrong password shows the error. */
import { describe, expect, it } from "vitest";
import { APP_URL, demoEmail } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { SignInPage } from "./pages/sign-in";

const browser = browserPerFile();

describe("sign-in", () => {
  it("a wrong password shows the error and stays on the sign-in page", async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    const signIn = new SignInPage(page);
    await signIn.signIn(demoEmail("scheduler"), "not-the-password");
    await signIn.error("do not match an account").waitFor();
    expect(new URL(page.url()).pathname).toBe("/signin");
    await screenshot(page, "signin-error");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });

  it("the demo scheduler signs in, sees the project and opens its scenario list", async () => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await new SignInPage(page).signInAs("scheduler");
    await expect.poll(() => page.getByTestId("signed-in-name").textContent()).toBe("Marco Ilves");
    await screenshot(page, "projects");
    expect(await seriousA11yViolations(page)).toEqual([]);
    // The scheduler is not on the Tern Point project: it must not be listed.
    expect(await page.getByText("Tern Point").count()).toBe(0);
    await page.getByRole("link", { name: /Kestrel Bay Causeway — deck overlay/ }).click();
    await page.waitForSelector("[data-testid=scenario-table] tbody tr");
    expect(await page.getByTestId("role-badge").textContent()).toBe("Scheduler");
    const rows = await page.locator("[data-testid=scenario-table] tbody tr").count();
    expect(rows).toBeGreaterThanOrEqual(3);
    // Sorting by name is a keyboard-reachable button in the header.
    await page.getByRole("button", { name: /Scenario/ }).click();
    await expect.poll(() => page.locator("th").first().getAttribute("aria-sort")).not.toBe("none");
    await screenshot(page, "project-scenarios");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });

  it("signed out, an app page sends you to sign in", async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    await page.goto(`${APP_URL}/projects`);
    expect(new URL(page.url()).pathname).toBe("/signin");
    await context.close();
  });
});
