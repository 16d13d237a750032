/**
 * Archiving a project, in Debian's Chromium: its administrator archives it from the project page after a
 * confirmation that says what archiving does; its pages then say so (the project page, a scenario's tabs, members,
 * compare), the plan opens read-only with the reason, the Share page offers no new link, the project list keeps it
 * under "Archived projects", and Restore brings it back into use. No serious axe finding on the archived pages.
 */
import { describe, expect, it } from "vitest";
import { APP_URL, call } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { cookieHeader, signedIn } from "./pages/sign-in";

const browser = browserPerFile();

describe("an archived project", () => {
  it("is archived and restored by its administrator, and reads as a record meanwhile", async () => {
    const { context, page } = await signedIn(browser(), "scheduler");
    const cookie = await cookieHeader(context);
    // A project of the scheduler's own (they are its administrator), with one scenario, so the demo stays as it is.
    const name = `Gull Point Overpass — archive ${Date.now()}`;
    const project = await call("/api/projects", { method: "POST", cookie, body: { name, structureName: "Gull Point Overpass", deckLengthFt: 900, startStationFt: 400, lanes: "L1, L2" } });
    expect(project.status).toBe(201);
    await page.goto(`${APP_URL}/projects/${project.body.id}/scenarios/new`);
    await page.getByLabel("Name", { exact: true }).fill("Summer plan");
    await page.getByRole("button", { name: "Create and open the plan" }).click();
    await page.waitForURL(/\/scenarios\/[0-9a-f-]{36}\/plan$/);
    const scenarioUrl = page.url().replace(/\/plan$/, "");

    await page.goto(`${APP_URL}/projects/${project.body.id}`);
    await page.getByTestId("archive-project").click();
    const dialog = page.getByTestId("archive-dialog");
    expect(await dialog.textContent()).toContain("Everything is kept");
    await dialog.getByRole("button", { name: "Archive the project" }).click();
    await page.getByTestId("archived-notice").waitFor();
    expect(await page.getByTestId("archived-notice").textContent()).toMatch(/Archived .* by .*Nothing can be changed, run or\s+published/);
    // Nothing to change on the project page: no New scenario, no details form, the location shown, not edited.
    expect(await page.getByRole("link", { name: "New scenario" }).count()).toBe(0);
    expect(await page.getByTestId("project-details").count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "archived-project");

    await page.goto(`${scenarioUrl}/plan`);
    await page.getByTestId("archived-notice").waitFor();
    await page.getByText("Read-only: the project is archived").waitFor();
    expect(await page.locator("fieldset[disabled]").count()).toBeGreaterThan(0);
    await page.goto(`${scenarioUrl}/share`);
    await page.getByTestId("no-new-links").waitFor();
    expect(await page.getByTestId("create-share-link").count()).toBe(0);
    expect(await page.getByTestId("publish-closures").count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);

    for (const where of ["members", "compare"]) {
      await page.goto(`${APP_URL}/projects/${project.body.id}/${where}`);
      await page.getByTestId("archived-notice").waitFor();
    }

    await page.goto(`${APP_URL}/projects`);
    const archivedList = page.getByTestId("archived-projects");
    expect(await archivedList.textContent()).toContain("Archived projects (1)");
    await archivedList.getByText("Archived projects").click();
    await archivedList.getByRole("link", { name: new RegExp(name) }).click();
    await page.waitForURL(`${APP_URL}/projects/${project.body.id}`);

    await page.getByTestId("restore-project").click();
    await expect.poll(() => page.getByTestId("archived-notice").count()).toBe(0);
    await page.getByTestId("project-details").waitFor();
    expect(await page.getByTestId("archive-project").count()).toBe(1);
    await context.close();
  });
});
