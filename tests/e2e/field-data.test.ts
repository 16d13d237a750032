/** The engineer recalibrates a scenario from a weather history CSV and a deck survey, in Chromium. */
import { beforeAll, describe, expect, it } from "vitest";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { call, mainDemoVariant, signInAs } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";

const browser = browserPerFile();
let scenarioId: string;
const dir = mkdtempSync(join(tmpdir(), "pourline-csv-"));

beforeAll(async () => {
  const cookie = await signInAs("engineer");
  scenarioId = await mainDemoVariant(cookie, "E2E recalibrated");
  // Three years of invented daily weather in °C and mm: every April day 20 °C / 8 °C, every fourth day 5 mm.
  const rows = ["date,tmax,tmin,precip"];
  for (let i = 0; i < 3 * 365; i++) {
    const d = new Date(Date.UTC(2021, 0, 1 + i));
    const april = d.getUTCMonth() === 3;
    rows.push(`${d.toISOString().slice(0, 10)},${april ? 20 : 10},${april ? 8 : 2},${i % 4 === 0 ? 5 : 0}`);
  }
  writeFileSync(join(dir, "station.csv"), rows.join("\n"));
  writeFileSync(join(dir, "survey.csv"), "from_station,to_station,repair_share\n12+00,50+00,0.15\n50+00,96+00,0.3\n");
});

describe("field data", () => {
  it("a weather history refits the climate profile and a survey sets the deterioration risk, each as a saved version", async () => {
    const { context, page } = await signedIn(browser(), "engineer");
    await new ScenarioPage(page, scenarioId).open("data");
    await page.getByTestId("weather-file").setInputFiles(join(dir, "station.csv"));
    await page.getByLabel("Temperatures in").selectOption("C");
    await page.getByLabel("Precipitation in").selectOption("mm");
    await page.getByTestId("weather-check").click();
    const table = page.getByTestId("weather-fit-table");
    await table.waitFor({ timeout: 20_000 });
    // April dry days: 20 °C = 68 °F and 8 °C = 46.4 °F, the means a hand calculation gives.
    expect(await table.locator("tr", { hasText: "Apr" }).textContent()).toMatch(/68\.0.*46\.4/);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByRole("button", { name: "Apply to the plan" }).click();
    await page.getByText("Applied — saved as a new version").waitFor();
    const after = (await call(`/api/scenarios/${scenarioId}`, { cookie: await signInAs("engineer") })).body.scenario;
    expect(after.version).toBe(2);
    expect(after.definition.weather.monthly[3].tmaxMeanF).toBe(68);
    expect(after.definition.weather.monthly[3].tminMeanF).toBe(46.4);

    await page.getByTestId("survey-file").setInputFiles(join(dir, "survey.csv"));
    await page.getByTestId("survey-check").click();
    await page.getByTestId("survey-table").waitFor();
    await page.getByRole("button", { name: "Apply to the plan" }).last().click();
    await expect.poll(async () => (await call(`/api/scenarios/${scenarioId}`, { cookie: await signInAs("engineer") })).body.scenario.version, { timeout: 15_000 }).toBe(3);
    const surveyed = (await call(`/api/scenarios/${scenarioId}`, { cookie: await signInAs("engineer") })).body.scenario.definition;
    expect(surveyed.deck.survey).toEqual([
      { fromStationFt: 1200, toStationFt: 5000, probability: 0.15 },
      { fromStationFt: 5000, toStationFt: 9600, probability: 0.3 },
    ]);
    await screenshot(page, "field-data");
    // The refitted profile in the plan editor: its chart (legend below it, nothing focusable inside the hidden
    // drawing) and its table, with no serious axe finding.
    const plan = new ScenarioPage(page, scenarioId);
    await plan.open("plan");
    await plan.openPlanSection("weather");
    await page.getByTestId("climate-table").waitFor();
    expect(await page.getByRole("list", { name: "Legend" }).textContent()).toContain("Wet days (%)");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  });
});
