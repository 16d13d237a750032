/**
 * The app on a phone (390 × 844 CSS px, a common phone's viewport), in Debian's Chromium: no page of the main demo
 * scrolls sideways, and the scenario's tab bar shows every tab inside the screen (it wraps onto a second row).
 * Wide tables scroll inside their own box (the field log's shifts are cards); axe finds nothing serious at this width
 * either. Before this check, the field log was 897 px wide (screen-reader-only
 * text in a table header sat beyond its scroll box) and the tab bar pushed every scenario page to 539 px.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { APP_URL, call, kestrelProject, signInAs, type DemoRole } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { newSearch, uniq } from "../helpers/authz-world";
import { createPastScenario } from "../helpers/progress-fixture";
import { ScenarioPage, type PlanSection, type ScenarioTab } from "./pages/scenario";

const PHONE = 390;

const browser = browserPerFile();
let projectId: string;
let scenarioId: string;

beforeAll(async () => {
  const cookie = await signInAs("scheduler");
  projectId = (await kestrelProject(cookie)).id;
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie });
  // The seeded main demo itself (read only here): it carries the recorded field log the variants do not.
  scenarioId = list.body.scenarios.find((s: { name: string }) => s.name === "Kestrel Bay Causeway — two seasons").id;
});

async function phone(role: DemoRole): Promise<Page> {
  const { page } = await signedIn(browser(), role, PHONE);
  return page;
}

/** How far the page reaches sideways, after its client-side drawing has settled. */
async function pageWidth(page: Page): Promise<number> {
  await page.waitForLoadState("networkidle");
  return page.evaluate(() => document.documentElement.scrollWidth);
}

describe("on a phone", () => {
  it("a scheduler's scenario pages, every plan section and the project pages fit the screen's width", async () => {
    const page = await phone("scheduler");
    const scenario = new ScenarioPage(page, scenarioId);
    const tabs: ScenarioTab[] = ["outlook", "plan", "progress", "lookAhead", "search", "data", "share", "brief"];
    const widths: Record<string, number> = {};
    // Accessibility at this width too: a table that only scrolls on a phone must be scrollable by keyboard, say.
    const a11y: Record<string, string[]> = {};
    const measure = async (name: string) => {
      widths[name] = await pageWidth(page);
      const found = await seriousA11yViolations(page);
      if (found.length) a11y[name] = found;
    };
    for (const tab of tabs) {
      await scenario.open(tab);
      await measure(tab);
    }
    await scenario.open("plan");
    for (const section of ["sequence", "stages", "crews", "calendar", "weather", "traffic"] as PlanSection[]) {
      await scenario.openPlanSection(section);
      await measure(`plan: ${section}`);
    }
    for (const path of ["/projects", "/projects/new", "/account", `/projects/${projectId}`, `/projects/${projectId}/compare`, `/projects/${projectId}/members`]) {
      await page.goto(`${APP_URL}${path}`);
      await measure(path);
    }
    const tooWide = Object.entries(widths).filter(([, w]) => w > PHONE);
    expect(tooWide).toEqual([]);
    expect(a11y).toEqual({});
  });

  it("the tab bar wraps: each of a scheduler's seven tabs lies inside the screen", async () => {
    const page = await phone("scheduler");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("outlook");
    const links = page.getByRole("navigation", { name: "Scenario sections" }).getByRole("link");
    expect(await links.count()).toBe(7);
    for (const box of await links.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON()))) {
      expect(box.left).toBeGreaterThanOrEqual(0);
      expect(box.right).toBeLessThanOrEqual(PHONE);
    }
    await screenshot(page, "phone-tabs");
  });

  it("the Outlook's date charts keep the tick that names the year when a phone-wide chart drops the crowded ones", async () => {
    const page = await phone("viewer");
    await new ScenarioPage(page, scenarioId).open("outlook");
    for (const chart of ["confidence-curve", "finish-histogram"]) {
      const ticks = page.locator(`[data-testid=${chart}] .recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value`);
      await ticks.first().waitFor({ timeout: 30_000 });
      expect(await ticks.first().textContent(), chart).toMatch(/ \d{4}$/);
    }
  });

  it("an inspector's field log, daily report and week-ahead board fit the screen; the log's shifts read as cards, nothing off to the side", async () => {
    const page = await phone("inspector");
    const scenario = new ScenarioPage(page, scenarioId);
    await scenario.open("progress");
    await page.getByRole("heading", { name: "Field log" }).waitFor();
    expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE);
    // Each shift is a card as wide as the box: nothing of it is hidden off to the right (it used to scroll sideways).
    const box = page.getByTestId("progress-table").locator("xpath=..");
    expect(await box.evaluate((e) => e.scrollWidth <= e.clientWidth)).toBe(true);
    for (const row of await page.getByTestId("progress-row").all()) {
      const b = (await row.boundingBox())!;
      expect(b.x + b.width).toBeLessThanOrEqual(PHONE);
    }
    await screenshot(page, "phone-field-log");
    // A day's report is the brief's width on paper, and the phone's on the phone.
    await page.goto(`${APP_URL}/scenarios/${scenarioId}/progress/daily`);
    await page.getByTestId("daily-report").waitFor();
    expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE);
    // Its shifts are cards too, each inside the screen.
    for (const row of await page.getByTestId("daily-shifts").locator("tbody tr").all()) {
      const b = (await row.boundingBox())!;
      expect(b.x + b.width).toBeLessThanOrEqual(PHONE);
    }
    expect(await page.getByTestId("daily-shifts").locator("xpath=..").evaluate((e) => e.scrollWidth <= e.clientWidth)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "phone-daily-report");
    await scenario.open("lookAhead");
    // The week ahead reads by day on a phone: a card a day, each shift's cell inside the screen (the seven-column
    // grid scrolled sideways), and a cell's reasons open under it rather than at the foot of the week.
    const days = page.getByTestId("look-ahead-day");
    await days.first().waitFor({ timeout: 30_000 });
    expect(await days.count()).toBe(7);
    expect(await page.getByTestId("look-ahead-grid").count()).toBe(0);
    const cells = page.getByTestId("look-ahead-days").locator("button[data-status]");
    expect(await cells.count()).toBeGreaterThanOrEqual(7);
    for (const b of await cells.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON()))) {
      expect(b.left).toBeGreaterThanOrEqual(0);
      expect(b.right).toBeLessThanOrEqual(PHONE);
    }
    await days.nth(1).locator("button[data-status]").first().click();
    const detail = days.nth(1).getByTestId("cell-detail");
    await detail.waitFor();
    const d = (await detail.boundingBox())!;
    expect(d.x + d.width).toBeLessThanOrEqual(PHONE);
    expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "phone-week-ahead");
  });

  it("a scheduler's finished plan search reads as a card a plan, with Save as scenario and Use in this plan inside the screen", { timeout: 120_000 }, async () => {
    // A scenario of its own, searched over holidays: its plan works through them, so standing down changes it.
    const engineer = await signInAs("engineer");
    const own = (await createPastScenario(engineer, projectId, uniq("Phone search"))).id;
    const searchId = await newSearch(own, engineer);
    const page = await phone("scheduler");
    await page.goto(`${APP_URL}/scenarios/${own}/search/${searchId}`);
    await page.getByText("3 of 3 finished.", { exact: false }).waitFor({ timeout: 60_000 });
    const plans = page.getByRole("list", { name: "Plans" });
    const cards = plans.getByRole("listitem");
    expect(await cards.count()).toBe(3);
    // The table's five columns and two buttons were 520 px wide and hid the buttons off to the right.
    expect(await page.getByTestId("search-table").locator("table").count()).toBe(0);
    const buttons = [...(await page.getByTestId("save-variant").all()), ...(await page.getByTestId("adopt-variant").all())];
    expect(buttons.length).toBe(3); // two variants to save, one of them changes the plan
    for (const b of buttons) {
      const box = (await b.boundingBox())!;
      expect(box.x).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width).toBeLessThanOrEqual(PHONE);
    }
    expect(await cards.filter({ hasText: "stand down for holidays" }).getByTestId("adopt-variant").count()).toBe(1);
    // Sorting is a select on a phone: by plan name, A to Z, then Z to A.
    const sort = page.getByLabel("Sort by");
    const names = async () => (await cards.locator("> div:first-child").allTextContents()).map((t) => t.replace(/Frontier$/, ""));
    await sort.selectOption({ label: "Plan, A to Z" });
    const az = await names();
    expect(az).toEqual([...az].sort((a, b) => a.localeCompare(b)));
    await sort.selectOption({ label: "Plan, Z to A" });
    expect(await names()).toEqual([...az].reverse());
    expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "phone-search-plans");
  });

  it("an administrator's Members page: each person's role and Remove lie inside the screen, not off to the side", async () => {
    const page = await phone("admin");
    await page.goto(`${APP_URL}/projects/${projectId}/members`);
    const people = page.getByRole("region", { name: "People on this project" });
    const roles = people.getByRole("combobox");
    await roles.first().waitFor();
    const removes = people.getByRole("button", { name: "Remove" });
    // At least the demo's five members (other tests may add people), each removable but the administrator herself.
    expect(await roles.count()).toBeGreaterThanOrEqual(5);
    expect(await removes.count()).toBe((await roles.count()) - 1);
    for (const control of [...(await roles.all()), ...(await removes.all())]) {
      const b = (await control.boundingBox())!;
      expect(b.x).toBeGreaterThanOrEqual(0);
      expect(b.x + b.width).toBeLessThanOrEqual(PHONE);
    }
    await screenshot(page, "phone-members");
  });
});
