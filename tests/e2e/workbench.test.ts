/**
 * The workbench as its users use it, in Debian's Chromium: a scheduler edits a rate, saves, runs 2,000
 * iterations and sees the curves; two people edit one scenario and the second save meets the conflict screen;
 * the owner executive compares two seeded scenarios; a share link opens with no session and shows the same P80.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { APP_URL, call, kestrelProject, mainDemoVariant, signInAs, type DemoRole } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { reforecastText } from "@/components/results/compare-logic";
import { signedIn as signedInAs } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";

const browser = browserPerFile();
let projectId: string;

beforeAll(async () => {
  projectId = (await kestrelProject(await signInAs("scheduler"))).id;
});

const signedIn = (role: DemoRole, width = 1280): Promise<{ context: BrowserContext; page: Page }> => signedInAs(browser(), role, width);

/** A fresh copy of the main demo scenario, so each test edits its own. */
async function freshVariant(name: string): Promise<string> {
  return mainDemoVariant(await signInAs("scheduler"), name);
}

async function editPlacementMode(page: Page, value: string) {
  const plan = new ScenarioPage(page, "");
  await plan.openPlanSection("crews");
  const mode = plan.field("operations.4.rate.dist.mode");
  await mode.waitFor();
  await mode.fill(value);
}

describe("workbench", () => {
  it("a scheduler edits a rate, saves, runs 2,000 iterations and sees the confidence curve and time–distance chart", async () => {
    const id = await freshVariant("E2E rate edit");
    const { context, page } = await signedIn("scheduler");
    const scenario = new ScenarioPage(page, id);
    await scenario.open("plan");
    await page.getByTestId("section-sequence").waitFor();
    await screenshot(page, "plan-sequence");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await editPlacementMode(page, "28");
    await screenshot(page, "plan-crews");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await scenario.save();
    await expect.poll(async () => (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario.version, { timeout: 15_000 }).toBe(2);
    const saved = (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario.definition;
    expect(saved.operations[4].rate.dist.mode).toBe(28);
    // The plan's history says what that save changed, in words, when asked.
    await page.getByText("History (2)", { exact: true }).click();
    await page.getByText("What changed in v2", { exact: true }).click();
    await expect.poll(() => page.getByTestId("revision-changes-2").textContent()).toMatch(/^Crews and rates: .+: \d+ → 28$/);
    await page.getByText("What changed in v1", { exact: true }).click();
    await page.getByText("The first saved version: nothing before it to compare with.").waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);

    await scenario.open("outlook");
    await page.getByTestId("no-run").waitFor();
    await page.getByLabel("Iterations").selectOption("2000");
    await page.getByTestId("start-run").click();
    const bar = page.getByTestId("run-progress");
    await bar.waitFor();
    await expect.poll(() => bar.getAttribute("aria-valuenow"), { timeout: 90_000 }).toBe("100");
    await page.getByText("Saved with this version.").waitFor({ timeout: 30_000 });
    // Drawn from the browser's own summary first, then shown as the server's (pending) run once the save is in.
    await page.getByTestId("pending-run").waitFor({ timeout: 30_000 });
    expect(await page.getByTestId("local-run").count()).toBe(0);
    expect(await page.getByTestId("results-view").getAttribute("data-run-seed")).toBe("pourline");
    await page.getByTestId("confidence-curve").waitFor({ timeout: 30_000 });
    await page.getByTestId("time-distance-chart").waitFor();
    const runs = await call(`/api/scenarios/${id}/runs`, { cookie: await signInAs("scheduler") });
    expect(runs.body.runs[0].iterations).toBe(2000);
    expect(runs.body.runs[0].scenarioVersion).toBe(2);
    expect(runs.body.runs[0].stale).toBe(false);
    await screenshot(page, "outlook");
    expect(await seriousA11yViolations(page)).toEqual([]);
    // Saved again after the run: the Outlook says the run is of an older version, and what the save since changed.
    const cookie = await signInAs("scheduler");
    const current = (await call(`/api/scenarios/${id}`, { cookie })).body.scenario;
    current.definition.operations[4].rate.dist.mode = 29;
    expect((await call(`/api/scenarios/${id}`, { method: "PUT", cookie, body: { name: current.name, definition: current.definition, version: 2, changeNote: "placement a little faster" } })).status).toBe(200);
    await page.reload();
    const since = page.getByTestId("changes-since-run");
    await since.getByText("What changed in v3", { exact: true }).click();
    await expect.poll(() => page.getByTestId("revision-changes-3").textContent()).toMatch(/^Crews and rates: .+: 28 → 29$/);
    expect(await since.getByText("What changed in v2", { exact: true }).count()).toBe(0); // the run knows v2
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });

  it("the sequence graph: a new operation lands clear of the others, every link takes Tab focus, Delete removes the focused one", async () => {
    const id = await freshVariant("E2E graph keyboard");
    const { context, page } = await signedIn("scheduler", 1440);
    await new ScenarioPage(page, id).open("plan");
    const edges = page.locator("[data-testid=sequence-graph] .react-flow__edge");
    await expect.poll(() => edges.count()).toBe(6);
    // The seven-operation chain is folded into two rows and fitted at full size (in one row it was fitted at about
    // 65 %, its labels at 10 px): every box is drawn nearly its 170 px wide, in two distinct rows.
    const nodes = page.locator("[data-testid=sequence-graph] .react-flow__node");
    await expect.poll(async () => Math.min(...(await nodes.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().width))))).toBeGreaterThanOrEqual(150);
    const tops = new Set((await nodes.evaluateAll((els) => els.map((e) => Math.round(e.getBoundingClientRect().top)))) as number[]);
    expect(tops.size).toBe(2);
    await page.locator("#new-op-name").fill("Joint repair");
    await page.locator("#new-op-name").press("Enter");
    await expect.poll(() => nodes.count()).toBe(8);
    const boxes = (await nodes.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON()))) as DOMRect[];
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        const [a, b] = [boxes[i], boxes[j]];
        expect(a.right <= b.left || b.right <= a.left || a.bottom <= b.top || b.bottom <= a.top, `operations ${i} and ${j} overlap`).toBe(true);
      }
    // Every link is reachable with Tab, and each one says what it is.
    await page.getByTestId("section-sequence").focus();
    const reached = new Set<string>();
    for (let i = 0; i < 80 && reached.size < 6; i++) {
      await page.keyboard.press("Tab");
      const label = await page.evaluate(() => (document.activeElement?.classList.contains("react-flow__edge") ? document.activeElement.getAttribute("aria-label") : null));
      if (label) reached.add(label);
    }
    expect(reached.size).toBe(6);
    await edges.nth(1).focus();
    await page.keyboard.press("Delete");
    await expect.poll(() => edges.count()).toBe(5);
    expect(await page.getByTestId("sequence-notice").textContent()).toMatch(/^Removed the link /);
    await context.close();
  });

  it("the outlook stays usable at tablet width (768 px)", async () => {
    const { context, page } = await signedIn("inspector", 768);
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: await signInAs("inspector") });
    await page.goto(`${APP_URL}/scenarios/${list.body.scenarios.at(-1).id}`);
    await page.getByTestId("time-distance-chart").waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    // An inspector reads: no run button.
    expect(await page.getByTestId("start-run").count()).toBe(0);
    await screenshot(page, "outlook-tablet");
    await context.close();
  });

  it("two people edit one scenario: the second save gets the conflict screen and nothing is overwritten", async () => {
    const id = await freshVariant("E2E conflict");
    const a = await signedIn("scheduler");
    const b = await signedIn("engineer");
    await new ScenarioPage(a.page, id).open("plan");
    await new ScenarioPage(b.page, id).open("plan");
    await editPlacementMode(a.page, "27");
    await editPlacementMode(b.page, "26");
    await a.page.getByTestId("save-scenario").click();
    await expect.poll(async () => (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario.version, { timeout: 15_000 }).toBe(2);
    await b.page.getByTestId("save-scenario").click();
    const dialog = b.page.getByTestId("conflict-dialog");
    await dialog.waitFor({ timeout: 15_000 });
    await expect.poll(() => dialog.textContent()).toContain("27");
    await screenshot(b.page, "conflict");
    expect(await seriousA11yViolations(b.page)).toEqual([]);
    const now = (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario;
    expect(now.version).toBe(2);
    expect(now.definition.operations[4].rate.dist.mode).toBe(27);
    await a.context.close();
    await b.context.close();
  });

  it("the owner executive compares two seeded scenarios", async () => {
    const { context, page } = await signedIn("viewer");
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: await signInAs("viewer") });
    // The seeded demo scenarios (other tests add their own, under other names).
    type Listed = { id: string; name: string; runId: string | null; reforecastP80: string | null };
    const all = (list.body.scenarios as Listed[]).filter((s) => s.name.startsWith("Kestrel Bay Causeway") && s.runId);
    // The plan of record (the job under way, re-forecast from its field log) and one plan never re-forecast.
    const seeded = [all.find((s) => s.reforecastP80)!, all.find((s) => !s.reforecastP80)!];
    const ids = seeded.map((s) => s.id);
    await page.goto(`${APP_URL}/projects/${projectId}/compare?ids=${ids.join(",")}`);
    await page.getByTestId("compare-curves").waitFor({ timeout: 20_000 });
    const table = page.getByTestId("compare-table");
    await table.waitFor();
    for (const s of seeded) expect(await table.textContent()).toContain(s.name);
    // The plan runs compared start from the plan's start; what the field log has made of the plan is said beside them.
    const answer = (await call(`/api/projects/${projectId}/compare?ids=${ids.join(",")}`, { cookie: await signInAs("viewer") })).body;
    const notice = page.getByTestId("compare-reforecast-notice");
    expect(await notice.textContent()).toContain(`${seeded[0].name} has been re-forecast from its field log: ${reforecastText(answer.scenarios[0].reforecast)}.`);
    expect(await notice.textContent()).not.toContain(`${seeded[1].name} has been re-forecast`);
    const reforecastRow = table.locator('[data-metric="reforecast"]');
    expect(await reforecastRow.locator("td").allTextContents()).toEqual([reforecastText(answer.scenarios[0].reforecast), "none"]);
    // A viewer cannot start a plan search, so the notice offers none.
    expect(await notice.getByRole("link", { name: /plan search/ }).count()).toBe(0);
    // Delay and cost sit beside the dates, with a figure for every seeded scenario.
    const delayRow = table.locator('[data-metric="delayP50"]');
    await delayRow.waitFor();
    expect(await delayRow.textContent()).toMatch(/veh-h/);
    expect(await table.locator('[data-metric="roadUserP50"]').textContent()).toMatch(/\$/);
    // A viewer reads and compares; no variant button.
    expect(await page.getByRole("button", { name: /variant/i }).count()).toBe(0);
    await screenshot(page, "compare");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });

  it("a share link opens in a fresh context without a session and shows the same P80 date; revoked, it is gone", async () => {
    const { context, page } = await signedIn("scheduler");
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: await signInAs("scheduler") });
    const target = list.body.scenarios.find((s: { runId: string | null; name: string }) => s.runId && /single season/i.test(s.name)) ?? list.body.scenarios.find((s: { runId: string | null }) => s.runId);
    const scenario = new ScenarioPage(page, target.id);
    await scenario.open("outlook");
    const p80 = (await page.getByTestId("p80-date").first().textContent())!.trim();
    await scenario.open("share");
    await page.getByLabel("Label (who it is for)").fill("Public information office");
    await page.getByTestId("create-share-link").click();
    const url = await page.getByTestId("share-link-url").inputValue();
    expect(url).toMatch(/\/shared\/[A-Za-z0-9_-]{43}$/);
    await screenshot(page, "share");
    expect(await seriousA11yViolations(page)).toEqual([]);

    const anonymous = await browser().newContext();
    const pub = await anonymous.newPage();
    await pub.goto(url);
    expect((await pub.getByTestId("p80-date").first().textContent())!.trim()).toBe(p80);
    expect(await pub.getByText("Sign out").count()).toBe(0);
    // The project line sits above the title, not under it (a negative margin once drew the title over it).
    const projectLine = (await pub.getByTestId("shared-project").boundingBox())!;
    const title = (await pub.getByTestId("scenario-name").boundingBox())!;
    expect(projectLine.y + projectLine.height).toBeLessThanOrEqual(title.y);
    await screenshot(pub, "shared-public");
    expect(await seriousA11yViolations(pub)).toEqual([]);

    // The visitor has no session: every write is refused.
    const token = url.split("/shared/")[1];
    const shared = await call(`/api/shared/${token}`);
    expect(shared.status).toBe(200);

    await page.getByRole("button", { name: /Revoke link Public information office/ }).click();
    // One click only asks: the dialog names the link and says what revoking does; nothing is revoked yet.
    const confirm = page.getByTestId("revoke-dialog");
    await confirm.waitFor();
    expect(await confirm.textContent()).toContain("Public information office");
    expect((await call(`/api/shared/${token}`)).status).toBe(200);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByTestId("revoke-dialog-confirm").click();
    await expect.poll(async () => (await call(`/api/shared/${token}`)).status, { timeout: 10_000 }).toBe(404);
    const gone = await pub.goto(url);
    expect(gone?.status()).toBe(404);
    await anonymous.close();
    await context.close();
  });

  it("the engineer weighs the holiday trade-off in one click, sees delay and cost, and opens the owner brief", async () => {
    const { context, page } = await signedIn("engineer");
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: await signInAs("engineer") });
    const main = list.body.scenarios.find((s: { name: string }) => s.name === "Kestrel Bay Causeway — two seasons");
    const scenario = new ScenarioPage(page, main.id);
    await scenario.open("outlook");
    await page.getByTestId("delay-panel").waitFor();
    expect(await page.getByTestId("delay-vehicle-hours").textContent()).toMatch(/\d/);
    await page.getByTestId("tradeoff-run").click();
    await page.getByTestId("tradeoff-sentence").waitFor({ timeout: 90_000 });
    expect(await page.getByTestId("tradeoff-sentence").textContent()).toMatch(/day/);
    await screenshot(page, "outlook-tradeoff");
    expect(await seriousA11yViolations(page)).toEqual([]);

    await scenario.open("brief");
    const brief = page.getByTestId("owner-brief");
    await brief.waitFor();
    const p80 = (await page.getByTestId("p80-date").first().textContent())!.trim();
    expect(await brief.textContent()).toContain("Assumptions");
    expect(await brief.textContent()).toContain("Planning aid, not an approval");
    expect(p80.length).toBeGreaterThan(5);
    await page.emulateMedia({ media: "print" });
    await screenshot(page, "owner-brief-print");
    expect(await page.locator("header").first().isVisible()).toBe(false);
    await context.close();
  });
});
