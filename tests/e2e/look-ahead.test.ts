/**
 * The week ahead in Debian's Chromium: the project sits at the fake weather service's cold-snap point; an
 * inspector opens the board from the scenario's tabs, sees tomorrow's placement blocked by the cold night and
 * opens the cell for the hour-by-hour reason.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";
import { createLookAheadScenario, FAKE_POINTS } from "../helpers/look-ahead-fixture";
import { isoDaysFromToday, openInFixture } from "../helpers/progress-fixture";

const browser = browserPerFile();
let scenarioId: string;
let projectId: string;

beforeAll(async () => {
  const engineer = await signInAs("engineer");
  projectId = (await kestrelProject(engineer)).id;
  expect((await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: engineer, body: FAKE_POINTS.coldSnap })).status).toBe(200);
  scenarioId = (await createLookAheadScenario(await signInAs("scheduler"), projectId, "E2E week ahead")).id;
});
afterAll(async () => {
  await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: await signInAs("engineer"), body: FAKE_POINTS.kestrelBay });
});

describe("week ahead", () => {
  it("an inspector sees tomorrow's placement blocked by a cold night and opens the reason", async () => {
    const { context, page } = await signedIn(browser(), "inspector");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("outlook");
    await scenario.tab("lookAhead").click();
    await page.getByTestId("look-ahead-grid").waitFor({ timeout: 30_000 });
    await expect.poll(() => scenario.tab("lookAhead").getAttribute("aria-current")).toBe("page");
    // The tests run the local stand-in service: the board says its weather is invented, not the real service's.
    expect(await page.getByTestId("forecast-source").textContent()).toMatch(/^Forecast for Cold Snap Flats, ZZ from the local stand-in weather service \(invented weather for the demo, not a real forecast\), fetched /);

    // Tomorrow, or the day after when tomorrow is 31 Dec (the fixture's winter): both are the fake's cold days.
    const coldDay = [1, 2].map((n) => isoDaysFromToday(n)).find(openInFixture)!;
    const cell = page.getByTestId(`cell-${coldDay}-day-overlay`);
    expect(await cell.getAttribute("data-status")).toBe("no");
    // Read at a glance: a mark and words, not colour alone.
    expect(await cell.textContent()).toMatch(/^✗blocked.*minimum temperature from 07:00/);
    expect(await cell.getAttribute("aria-label")).toMatch(/Overlay placement, Day shift, \w+day \d{1,2} [A-Z][a-z]{2} \d{4}: blocked — minimum temperature from 07:00/);

    await cell.click();
    const detail = page.getByTestId("cell-detail");
    await detail.waitFor();
    expect(await detail.getByRole("heading", { level: 3 }).textContent()).toContain(`Overlay placement, Day shift`);
    expect(await detail.getByTestId("failing-gates").textContent()).toMatch(/Minimum temperature fails \d{1,2} [A-Z][a-z]{2} 07:00–17:00/);
    const firstHour = detail.getByTestId("hour-reasons").locator("tbody tr").first();
    expect(await firstHour.textContent()).toMatch(/07:00.*✗ fails.*Minimum temperature: \d+ °F against a minimum of 45 °F/);
    await screenshot(page, "week-ahead-cold-snap");
    expect(await seriousA11yViolations(page)).toEqual([]);
    // An inspector reads the board but does not set up the daily e-mail.
    expect(await page.getByTestId("look-ahead-notice").count()).toBe(0);
    await context.close();
  });
});
