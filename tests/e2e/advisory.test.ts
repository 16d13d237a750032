/**
 * The traffic engineer and the public, in Debian's Chromium: the plan editor's closure-hours advisor warns
 * about a window that backs traffic up past the limit; publishing closures shows what will be sent and asks
 * first; the public travel advisory opens with no session, reads by keyboard and has no serious axe finding.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, kestrelProject, mainDemoVariant, signInAs } from "../helpers/app";
import { forgetRecentMail } from "../helpers/mail-quota";
import { serverRunDone } from "../helpers/jobs";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";
import { formatDateTimeIn } from "../../src/lib/format";
import { todayIn } from "../../src/lib/progress-schema";

const browser = browserPerFile();
let scenarioId: string;

beforeAll(async () => {
  const cookie = await signInAs("engineer");
  scenarioId = await mainDemoVariant(cookie, "E2E advisory");
  expect((await serverRunDone(scenarioId, cookie, { seed: "e2e-advisory", iterations: 20 })).status).toBe("completed");
  // This file publishes as the demo engineer on the demo project: start with the hour's e-mail quota unused.
  await forgetRecentMail((await kestrelProject(cookie)).id);
}, 120_000);

describe("closure hours, publishing and the public advisory", { timeout: 180_000 }, () => {
  let advisoryUrl = "";

  it("the Traffic section shows when each closure may stand and warns about holiday-weekend days", async () => {
    const { context, page } = await signedIn(browser(), "engineer");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("plan");
    await scenario.openPlanSection("traffic");
    const advisor = page.getByTestId("closure-advisor");
    await advisor.waitFor();
    // The demo's day window meets holiday traffic on getaway days: the queue passes the 1-mile default.
    await expect.poll(async () => (await page.getByTestId("closure-advisor-warnings").textContent()) ?? "").toContain("holiday-weekend days");
    await screenshot(page, "plan-closure-advisor");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });

  it("publishing shows the notice and its recipients first, and sends only on confirmation", async () => {
    const { context, page } = await signedIn(browser(), "engineer");
    await new ScenarioPage(page, scenarioId).open("share");
    await page.getByTestId("publish-closures").click();
    const dialog = page.getByTestId("publish-dialog");
    await dialog.waitFor();
    await page.getByTestId("publish-dialog-text").waitFor();
    // What the text lists depends on today's date (closures from today on: tests/integration/closure-notices.test.ts).
    expect(await page.getByTestId("publish-dialog-text").textContent()).toMatch(/\d+ closure periods in all/);
    // It says which forecast the closures come from (this scenario has a plan run and no re-forecast).
    expect(await page.getByTestId("publish-dialog-source").textContent()).toMatch(/^From the newest forecast: Forecast run \d{1,2} \w{3} \d{4}/);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "publish-preview");
    // Cancel sends nothing: no publication is recorded.
    await page.getByRole("button", { name: /Cancel/ }).click();
    const none = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: await signInAs("engineer") });
    expect(none.body.publications).toHaveLength(0);
    await page.getByTestId("publish-closures").click();
    await page.getByTestId("publish-dialog-confirm").click();
    const link = page.getByTestId("advisory-link");
    await link.waitFor();
    advisoryUrl = (await link.getAttribute("href")) ?? "";
    expect(advisoryUrl).toContain("/advisory/");
    await context.close();
  });

  it("a reader whose browser is in another time zone sees each moment as the server shows it (one display zone)", async () => {
    const zone = process.env.POURLINE_TIME_ZONE!;
    expect(zone).toBe("America/Chicago"); // npm test sets it: not the machine's UTC, not the browser's Tokyo below
    const { context, page } = await signedIn(browser(), "engineer", 1280, { timezoneId: "Asia/Tokyo" });
    await new ScenarioPage(page, scenarioId).open("share");
    const listed = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: await signInAs("engineer") });
    const publishedAt = new Date(listed.body.publications[0].publishedAt);
    // Drawn in the browser (the list comes from the API after the page loads), in the installation's zone.
    const line = page.getByTestId("closure-publications").locator("li").first();
    await expect.poll(async () => (await line.textContent()) ?? "").toContain(`${formatDateTimeIn(publishedAt, zone)} by `);
    expect(await line.textContent()).not.toContain(formatDateTimeIn(publishedAt, "Asia/Tokyo"));
    await page.goto(`${APP_URL}/account`);
    expect(await page.getByTestId("display-time-zone").textContent()).toContain(`${zone} time`);
    await context.close();
  });

  it("the weekly e-mail of the week ahead is set on the Share page, and the Members page says who gets it", async () => {
    const { context, page } = await signedIn(browser(), "admin");
    await new ScenarioPage(page, scenarioId).open("share");
    const weekly = page.getByTestId("closure-weekly");
    await expect.poll(async () => (await page.getByTestId("closure-weekly-state").textContent()) ?? "").toBe("Off.");
    // A weekday three days from today's where the work is: the app's own pass does not send during the test.
    const day = (new Date(`${todayIn(process.env.POURLINE_TIME_ZONE!)}T12:00:00Z`).getUTCDay() + 3) % 7;
    const dayName = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"][day];
    await weekly.getByLabel("Send it weekly").check();
    await weekly.getByLabel("On", { exact: true }).selectOption(String(day));
    await weekly.getByLabel("After", { exact: true }).selectOption("7");
    await weekly.getByRole("button", { name: "Save" }).click();
    await expect.poll(async () => (await page.getByTestId("closure-weekly-state").textContent()) ?? "").toBe(`Weekly on ${dayName} after 07:00.`);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "closure-weekly");
    const admin = await signInAs("admin");
    const projectId = (await call(`/api/scenarios/${scenarioId}`, { cookie: admin })).body.scenario.projectId as string;
    await page.goto(`${APP_URL}/projects/${projectId}/members`);
    expect(await page.getByTestId("project-mail-closures").textContent()).toContain(`also goes to them weekly, on ${dayName} after 07:00 (the plan's time zone)`);
    // Off again, through the API the form uses: the demo project sends nothing weekly in other tests.
    expect((await call(`/api/projects/${projectId}/closure-weekly`, { method: "PUT", cookie: admin, body: { closureWeeklyDay: null, closureWeeklyHour: null } })).status).toBe(200);
    await context.close();
  });

  it("the advisory opens without signing in, reads by keyboard and has no serious axe finding", async () => {
    const context = await browser().newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const res = await page.goto(new URL(new URL(advisoryUrl).pathname, APP_URL).toString());
    expect(res?.status()).toBe(200);
    await page.getByTestId("advisory-title").waitFor();
    expect(await page.getByText("do not use your phone or photograph the work zone").count()).toBe(1);
    // A first day listed after today (the demo's winter) is said first, so nobody reads the list as closed today.
    const firstDay = (await page.getByTestId("advisory-day").first().locator("h3 span").first().textContent())!.trim();
    const today = todayIn("America/Chicago"); // the demo plan's time zone
    const firstIso = new Date(`${firstDay.replace(/^\w+ /, "")} 12:00 UTC`).toISOString().slice(0, 10);
    const nothingBefore = page.getByTestId("advisory-nothing-before");
    if (firstIso > today) expect(await nothingBefore.textContent()).toBe(`Nothing is planned to be closed before ${firstDay}.`);
    else expect(await nothingBefore.count()).toBe(0);
    // Read on a phone: the page does not scroll sideways (its day tables scroll in their own boxes).
    await page.waitForLoadState("networkidle");
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "public-advisory");
    // Keyboard: Tab reaches the calendar link (the page's one control).
    let reached = false;
    for (let i = 0; i < 10 && !reached; i++) {
      await page.keyboard.press("Tab");
      reached = await page.evaluate(() => document.activeElement?.textContent?.includes("Add every closure to your calendar") ?? false);
    }
    expect(reached).toBe(true);
    await context.close();
  });
});
