/**
 * Stages as a scheduler uses them, in Debian's Chromium: open the staged three-lane demo, edit its second
 * stage in the Stages section (name, station in station notation, time lag), save, run, and see both stages in
 * the time–distance chart, in the closure strip under it and in the finish table.
 */
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";

const STAGED = JSON.parse(readFileSync(new URL("../../scenarios/kestrel-staged-three-lane.json", import.meta.url), "utf8"));

const browser = browserPerFile();
let projectId: string;

beforeAll(async () => {
  projectId = (await kestrelProject(await signInAs("scheduler"))).id;
});

/** A fresh copy of the staged demo: a variant of the seeded one when the seed has it, else the demo file itself. */
async function stagedScenario(): Promise<string> {
  const cookie = await signInAs("scheduler");
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie });
  const seeded = list.body.scenarios.find((s: { name: string }) => s.name === STAGED.name);
  const res = seeded
    ? await call(`/api/scenarios/${seeded.id}/variants`, { method: "POST", cookie, body: { name: "E2E staged" } })
    : await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name: "E2E staged", description: STAGED.description ?? "", definition: STAGED } });
  expect(res.status).toBe(201);
  return res.body.id;
}

describe("stages", () => {
  it("a scheduler edits a stage of the staged demo, saves, runs and sees both stages in the time–distance chart", async () => {
    const id = await stagedScenario();
    const { context, page } = await signedIn(browser(), "scheduler");
    const scenario = new ScenarioPage(page, id);
    await scenario.open("plan");
    await scenario.openPlanSection("stages");
    const second = page.getByTestId("stage-1");
    await second.waitFor();
    expect(await page.getByTestId("stage-0").textContent()).toContain("Stage 1");
    // Stage 1 keeps its own lane behind barrier; stage 2 follows it once it is finished.
    expect(await page.getByTestId("stages.0.standing-mode-same").isChecked()).toBe(true);
    expect(await page.locator('[id="stages.1.after.when"]').inputValue()).toBe("stageDone");

    await page.locator('[id="stages.1.name"]').fill("Stage 2: L2 and L3 behind barrier");
    const from = page.locator('[id="stages.1.fromStationFt"]');
    await from.fill("5+0x");
    await page.getByText("Write a station as 12+50 or as feet (1250).").waitFor();
    await from.fill("5+00");
    await page.getByText("STA 5+00 (500 ft)").waitFor();
    await page.locator('[id="stages.1.after.lagHours"]').fill("48");
    await screenshot(page, "plan-stages");
    expect(await page.locator('[id="stages.1.after.stage"] option:checked').textContent()).toBe(STAGED.stages[0].name);
    expect(await seriousA11yViolations(page)).toEqual([]);

    await scenario.save();
    await expect.poll(async () => (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario.version, { timeout: 15_000 }).toBe(2);
    const saved = (await call(`/api/scenarios/${id}`, { cookie: await signInAs("scheduler") })).body.scenario.definition;
    expect(saved.stages[1]).toMatchObject({ name: "Stage 2: L2 and L3 behind barrier", fromStationFt: 500, lanes: ["L2", "L3"], standingLanesClosed: ["L2", "L3"] });
    expect(saved.stages[1].after).toEqual({ stage: "stage-1", when: "stageDone", lagFt: 0, lagHours: 48 });
    expect(saved.stages[0]).toMatchObject({ lanes: ["L1"], standingLanesClosed: ["L1"] });
    // Operations that need no short-term closure still need none after a save from the editor.
    expect(saved.operations.find((o: { id: string }) => o.id === "setup").closure).toBeUndefined();

    await scenario.open("outlook");
    await page.getByTestId("no-run").waitFor();
    await page.getByLabel("Iterations").selectOption("1000");
    await page.getByTestId("start-run").click();
    const bar = page.getByTestId("run-progress");
    await bar.waitFor();
    await expect.poll(() => bar.getAttribute("aria-valuenow"), { timeout: 90_000 }).toBe("100");
    const chart = page.getByTestId("time-distance-chart");
    await chart.waitFor({ timeout: 30_000 });

    // Both stages: the selector, a marked start for each in the chart, a barrier row for each in the strip.
    const selector = page.getByTestId("stage-selector");
    expect(await selector.textContent()).toMatch(/All stages.*Stage 1: .*Stage 2: L2 and L3 behind barrier/);
    for (const mark of ["Stage 1 starts", "Stage 2 starts"]) await chart.locator("svg text", { hasText: mark }).first().waitFor();
    const strip = page.getByTestId("closure-strip");
    expect(await strip.textContent()).toContain(`Barrier of ${STAGED.stages[0].name}`);
    expect(await strip.textContent()).toContain("Barrier of Stage 2: L2 and L3 behind barrier");
    expect(await page.getByTestId("stage-finishes").textContent()).toMatch(/Stage 1: .*restored P50 .*Stage 2: L2 and L3 behind barrier \(L2, L3\): restored P50/);
    const table = page.getByTestId("operations-table");
    expect(await table.textContent()).toContain("Lanes L2, L3 restored");
    // Nothing added for stages widens the page (hidden tables included).
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(1);
    await chart.scrollIntoViewIfNeeded();
    await screenshot(page, "outlook-stages");
    await chart.screenshot({ path: new URL("./screenshots/time-distance-stages.png", import.meta.url).pathname });
    expect(await seriousA11yViolations(page)).toEqual([]);

    // One stage at a time: only its operations' rows remain in the chart's table.
    await selector.getByText("Stage 2: L2 and L3 behind barrier").click();
    const rows = page.getByTestId("time-distance-table").locator("tbody tr");
    await expect.poll(async () => (await rows.allTextContents()).every((r) => r.includes("Stage 2: L2 and L3 behind barrier"))).toBe(true);
    await chart.screenshot({ path: new URL("./screenshots/time-distance-stage-2.png", import.meta.url).pathname });
    await context.close();
  });
});
