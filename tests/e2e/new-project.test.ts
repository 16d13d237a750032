/**
 * A project from nothing, in Debian's Chromium: a scheduler opens New project from the project list, leaves the
 * deck length empty and is told so beside the field, fixes it, lands on the new project's page (administrator,
 * no scenario yet), adds the region under Edit project details, and makes a first scenario from the standard
 * template over that deck, whose week ahead sends them to set the structure's location; no serious axe finding.
 */
import { describe, expect, it } from "vitest";
import { APP_URL } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";

const browser = browserPerFile();

describe("a new project", () => {
  it("is started from the project list and takes its first scenario from the template", async () => {
    const { context, page } = await signedIn(browser(), "scheduler");
    await page.getByRole("link", { name: "New project" }).click();
    await page.waitForURL(`${APP_URL}/projects/new`);
    const name = `Heron Creek Bridge — deck overlay ${Date.now()}`;
    await page.getByLabel("Project name").fill(name);
    await page.getByLabel("Structure").fill("Heron Creek Bridge (northbound)");
    await page.getByLabel("Start station").fill("12+00");
    await page.getByLabel("Lanes").fill("L1, L2, L3");
    await page.getByRole("button", { name: "Create the project" }).click();
    // The deck length was left empty: said beside it, in words, and nothing was sent.
    await expect.poll(() => page.locator("#project-deckLengthFt-error").textContent()).toBe("Deck length (ft) must be a number of feet");
    expect(await page.getByLabel("Deck length (ft)").getAttribute("aria-invalid")).toBe("true");
    expect(page.url()).toBe(`${APP_URL}/projects/new`);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "new-project-form");

    await page.getByLabel("Deck length (ft)").fill("1450");
    await page.getByRole("button", { name: "Create the project" }).click();
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await page.getByRole("heading", { name, level: 1 }).waitFor();
    expect(await page.getByText("Heron Creek Bridge (northbound) · 1,450 ft from STA 12+00 · L1, L2, L3").count()).toBe(1);
    expect(await page.getByText("Administrator", { exact: true }).count()).toBe(1);
    await page.getByRole("heading", { name: "No scenarios yet" }).waitFor();

    // Its administrator adds the region later: the project line says so after the save.
    await page.getByText("Edit project details").click();
    await page.getByTestId("project-details").getByLabel("Region (optional)").fill("Marrin County");
    await page.getByRole("button", { name: "Save details" }).click();
    await page.getByText("Details saved.").waitFor();
    await expect.poll(() => page.getByText("Heron Creek Bridge (northbound) · Marrin County · 1,450 ft from STA 12+00 · L1, L2, L3").count()).toBe(1);
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByRole("link", { name: "New scenario" }).first().click();
    await page.waitForURL(/\/scenarios\/new$/);
    await page.getByLabel("Name", { exact: true }).fill("First plan");
    await page.getByRole("button", { name: "Create and open the plan" }).click();
    await page.waitForURL(/\/scenarios\/[0-9a-f-]{36}\/plan$/);
    await page.getByRole("heading", { name: "First plan", level: 1 }).waitFor();
    // The plan editor opens on the template over this deck: seven operations in the sequence graph.
    await expect.poll(() => page.locator("[data-testid=sequence-graph] .react-flow__node").count(), { timeout: 30_000 }).toBe(7);
    await screenshot(page, "new-project-first-plan");

    // Its week ahead has no forecast until the structure's location is set: the board says so and links there.
    await page.getByRole("navigation", { name: "Scenario sections" }).getByRole("link", { name: "Week ahead" }).click();
    await page.getByTestId("forecast-message").waitFor();
    expect(await page.getByTestId("forecast-message").textContent()).toContain("The project has no location yet");
    await page.getByTestId("forecast-message").getByRole("link", { name: "Set the location" }).click();
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}#location-heading$/);
    await page.getByRole("heading", { name: "Location for the weather forecast" }).waitFor();
    await context.close();
  });
});
