/**
 * The plan editor's calendar tables (shifts, short-term closures, closure windows) as a scheduler and as a
 * read-only viewer, in Debian's Chromium: a window added reaches the saved scenario, a shift added and removed
 * again leaves the shifts as they were; the viewer sees the same rows with no Add or Remove button; no serious
 * axe finding either way.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, mainDemoVariant, signInAs } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";

const browser = browserPerFile();
let scenarioId: string;

beforeAll(async () => {
  scenarioId = await mainDemoVariant(await signInAs("scheduler"), "E2E calendar tables");
});

async function definition() {
  return (await call(`/api/scenarios/${scenarioId}`, { cookie: await signInAs("scheduler") })).body.scenario;
}

describe("calendar tables", () => {
  it("a scheduler adds a closure window, adds and removes a shift, and saves: the window is in the saved scenario", async () => {
    const before = (await definition()).definition;
    const { context, page } = await signedIn(browser(), "scheduler");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("plan");
    await scenario.openPlanSection("calendar");
    const windows = page.getByRole("region", { name: "Closure windows" });
    const windowRows = windows.locator("tbody tr");
    await windowRows.first().waitFor();
    const nWindows = before.calendar.closureWindows.length;
    expect(await windowRows.count()).toBe(nWindows);

    // A new window: Saturdays, 06:00–14:00, under the first closure (the default the Add button picks).
    await windows.getByRole("button", { name: "Add window" }).click();
    await expect.poll(() => windowRows.count()).toBe(nWindows + 1);
    await page.getByLabel(`Window ${nWindows + 1} start hour`).fill("6");
    await page.getByLabel(`Window ${nWindows + 1} end hour`).fill("14");
    const days = page.getByRole("group", { name: `Window ${nWindows + 1} day types` });
    await days.getByLabel("Weekday").uncheck();
    await days.getByLabel("Saturday").check();

    // A shift added by mistake and removed again leaves the shifts as they were.
    const shifts = page.getByRole("region", { name: "Shifts" });
    const nShifts = before.calendar.shifts.length;
    await shifts.getByRole("button", { name: "Add shift" }).click();
    await expect.poll(() => shifts.locator("tbody tr").count()).toBe(nShifts + 1);
    await shifts.getByRole("button", { name: `Remove shift ${nShifts + 1}` }).click();
    await expect.poll(() => shifts.locator("tbody tr").count()).toBe(nShifts);
    await screenshot(page, "plan-calendar");
    expect(await seriousA11yViolations(page)).toEqual([]);

    await scenario.save();
    await expect.poll(async () => (await definition()).version, { timeout: 15_000 }).toBe(2);
    const saved = (await definition()).definition;
    expect(saved.calendar.shifts).toEqual(before.calendar.shifts);
    expect(saved.calendar.closureWindows).toHaveLength(nWindows + 1);
    expect(saved.calendar.closureWindows[nWindows]).toEqual({ closure: before.calendar.closures[0].id, dayTypes: ["saturday"], startHour: 6, endHour: 14 });
    await context.close();
  });

  it("a viewer sees the calendar's rows and no Add or Remove button", async () => {
    const saved = (await definition()).definition;
    const { context, page } = await signedIn(browser(), "viewer");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("plan");
    await scenario.openPlanSection("calendar");
    for (const [name, count] of [
      ["Shifts", saved.calendar.shifts.length],
      ["Short-term closures", saved.calendar.closures.length],
      ["Closure windows", saved.calendar.closureWindows.length],
    ] as const) {
      const region = page.getByRole("region", { name });
      await region.locator("tbody tr").first().waitFor();
      expect(await region.locator("tbody tr").count()).toBe(count);
      expect(await region.getByRole("button").count()).toBe(0);
    }
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });
});
