/**
 * A scheduler's plan search on a job under way, in Debian's Chromium: the form starts from the field log by default
 * (as of the last day it records), a start date cannot be chosen then, and the search's page says it searched the
 * rest of the job and what a saved variant is; a variant used in the plan becomes its next version, and the Field log
 * opens to re-forecast it.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { uniq } from "../helpers/authz-world";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { APP_URL } from "../helpers/app";
import { formatIsoDate } from "../../src/lib/format";

const browser = browserPerFile();
let scenarioId: string;
const lastShift = isoDaysFromToday(-19);

beforeAll(async () => {
  const engineer = await signInAs("engineer");
  const projectId = (await kestrelProject(engineer)).id;
  scenarioId = (await createPastScenario(engineer, projectId, uniq("E2E rest of the job"))).id;
  for (const [day, from, to] of [[isoDaysFromToday(-20), 0, 300], [lastShift, 300, 600]] as const) {
    const res = await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie: engineer, body: { workDate: day, shift: "day", operationId: "milling", fromStationFt: from, toStationFt: to, crew: "M1" } });
    expect(res.status).toBe(201);
  }
}, 60_000);

describe("a plan search of the rest of the job", { timeout: 120_000 }, () => {
  it("starts from the field log by default and says so on the search's page", async () => {
    const { context, page } = await signedIn(browser(), "scheduler");
    await page.goto(`${APP_URL}/scenarios/${scenarioId}/search`);
    const from = page.getByTestId("search-from");
    await from.waitFor();
    expect(await from.getByRole("radio", { name: /From the field log as of/ }).isChecked()).toBe(true);
    expect(await page.getByLabel("Data date").inputValue()).toBe(lastShift);
    expect(await from.textContent()).toContain(`2 shifts in it now, the last on ${formatIsoDate(lastShift)}`);
    // The start date is history once the work has started.
    expect(await page.getByRole("checkbox", { name: /Start dates \(not from the field log/ }).isDisabled()).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByLabel("Iterations per plan").selectOption("200");
    await page.getByTestId("start-search").click();
    await page.waitForURL(/\/search\/[0-9a-f-]{36}$/);
    const said = page.getByTestId("search-from-field-log");
    await said.waitFor();
    expect(await said.textContent()).toBe(`The rest of the job: each plan starts from the field log as of ${formatIsoDate(lastShift)} (2 shifts when the search began), as a re-forecast does.`);
    await page.getByText("3 of 3 finished.", { exact: false }).waitFor({ timeout: 60_000 });
    expect(await page.getByTestId("search-save-note").textContent()).toContain("the new scenario has no field log of its own");
    await screenshot(page, "search-rest-of-job");

    // Standing down for holidays (the fixture works through them), made the plan itself: a new version that keeps
    // the field log, and on to the Field log to re-forecast it.
    // Working through them is what the plan does: nothing to use, so no button.
    expect(await page.getByRole("row", { name: /work through holidays/ }).getByTestId("adopt-variant").count()).toBe(0);
    await page.getByRole("row", { name: /stand down for holidays/ }).getByTestId("adopt-variant").click();
    const dialog = page.getByTestId("adopt-dialog");
    expect(await dialog.textContent()).toContain("“stand down for holidays” becomes version 2 of this scenario");
    await dialog.getByRole("button", { name: "Use in this plan" }).click();
    await page.waitForURL(`${APP_URL}/scenarios/${scenarioId}/progress`);
    expect(await page.getByText(/^Version 2 · last saved/).count()).toBe(1);
    await context.close();
  });
});
