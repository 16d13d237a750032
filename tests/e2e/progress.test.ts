/**
 * The field log in Debian's Chromium: an inspector logs several shifts (one refused with the field named),
 * then the engineer re-forecasts from the last data date and sees the forecast drift chart, the plan first, and
 * deletes a shift: it stays on record under "Deleted shifts", and the re-forecast that used it is behind the field;
 * then puts it back.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { APP_URL, call, kestrelProject, signInAs, type DemoRole } from "../helpers/app";
import { browserPerFile, overflowing, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn as signedInAs } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { formatIsoDate, formatIsoDay } from "@/lib/format";

const browser = browserPerFile();
let scenarioId: string;
const day = (n: number) => isoDaysFromToday(-21 + n);
/** The form's confirmation of a recorded shift: the operation, the shift, the day in words, the stations. */
const recorded = (operation: string, iso: string) => new RegExp(`^Recorded ${operation}, .+ of ${formatIsoDay(iso)}, STA \\d+\\+\\d{2} to STA \\d+\\+\\d{2}\\.$`);

beforeAll(async () => {
  const scheduler = await signInAs("scheduler");
  const projectId = (await kestrelProject(scheduler)).id;
  scenarioId = (await createPastScenario(scheduler, projectId, "E2E field log")).id;
  const planRun = await call(`/api/scenarios/${scenarioId}/runs`, { method: "POST", cookie: scheduler, body: { seed: "plan", iterations: 50 } });
  expect(planRun.status).toBe(202);
  expect((await waitForJob(planRun.body.job.id, scheduler)).status).toBe("completed");
});

async function signedIn(role: DemoRole): Promise<Page> {
  return (await signedInAs(browser(), role)).page;
}

async function recordShift(page: Page, s: { date: string; op: string; from: number; to: number; temp?: number }) {
  const form = page.getByTestId("progress-form");
  await form.locator("#new-workDate").fill(s.date);
  await form.locator("#new-operationId").selectOption(s.op);
  await form.locator("#new-fromStationFt").fill(String(s.from));
  await form.locator("#new-toStationFt").fill(String(s.to));
  if (s.temp !== undefined) await form.locator("#new-tempF").fill(String(s.temp));
  await form.getByTestId("record-progress").click();
}

describe("field log", () => {
  it("an inspector logs several shifts; the engineer re-forecasts and sees the drift", async () => {
    const inspector = await signedIn("inspector");
    const log = new ScenarioPage(inspector, scenarioId);
    await log.open("progress");
    await inspector.getByTestId("progress-form").waitFor();
    await expect.poll(() => log.tab("progress").getAttribute("aria-current")).toBe("page");

    await recordShift(inspector, { date: day(1), op: "milling", from: 0, to: 500, temp: 58 });
    await inspector.getByText(recorded("Mechanical milling", day(1))).waitFor();
    // Overlay ahead of milling: refused, and the message stands under the field it names.
    await recordShift(inspector, { date: day(1), op: "overlay", from: 0, to: 700 });
    const err = inspector.locator("#new-toStationFt-error");
    await err.waitFor();
    expect(await err.textContent()).toMatch(/Overlay placement cannot be recorded ahead of Mechanical milling/);
    await recordShift(inspector, { date: day(2), op: "milling", from: 500, to: 1000, temp: 61 });
    await inspector.getByText(recorded("Mechanical milling", day(2))).waitFor();
    await recordShift(inspector, { date: day(2), op: "overlay", from: 0, to: 400, temp: 61 });
    await inspector.getByText(recorded("Overlay placement", day(2))).waitFor();
    await expect.poll(() => inspector.getByTestId("progress-row").count(), { timeout: 15_000 }).toBe(3);
    expect(await inspector.getByTestId("reforecast-button").count()).toBe(0); // inspectors record, engineers forecast
    // One operation's shifts only, then every operation again.
    await inspector.getByLabel("Show", { exact: true }).selectOption({ label: "Overlay placement" });
    expect((await inspector.getByTestId("progress-row").allTextContents()).map((r) => r.includes("Overlay placement"))).toEqual([true]);
    await inspector.getByLabel("Show", { exact: true }).selectOption({ label: "Every operation" });
    expect(await inspector.getByTestId("progress-row").count()).toBe(3);
    // Progress to date: milling 0–500 and 500–1000 is the whole 1,000 ft deck; overlay 0–400.
    // Each row ends with where the operation stands against the plan run's median iteration at the log's last day.
    const against = "(On plan|[\\d,]+ ft behind — where the plan was on \\d+ \\w+ \\d{4}(, \\d+ working days? earlier)?|[\\d,]+ ft ahead — where the plan gets on \\d+ \\w+ \\d{4}(, \\d+ working days? later)?)";
    await expect.poll(() => inspector.getByTestId("progress-to-date-row").allTextContents()).toEqual([
      expect.stringMatching(new RegExp(`^Mechanical milling1,000 ft of 1,000 ft100 %2—\\d+ \\w+ \\d{4}\\d+ \\w+ \\d{4}${against}$`)),
      expect.stringMatching(new RegExp(`^Overlay placement400 ft of 1,000 ft40 %1—\\d+ \\w+ \\d{4}\\d+ \\w+ \\d{4}${against}$`)),
    ]);
    expect(await inspector.getByTestId("progress-to-date").locator("xpath=../..").textContent()).toContain(`Against the plan: how far the plan run of`);
    // On a phone the standing is a line under each operation, in view, not a column off to the right of the screen.
    expect(await inspector.getByTestId("progress-to-date-against").first().isVisible()).toBe(false);
    await inspector.setViewportSize({ width: 390, height: 844 });
    const line = inspector.getByTestId("progress-to-date-against").first();
    await line.waitFor();
    expect(await line.textContent()).toMatch(new RegExp(`^Against the plan: ${against}$`));
    expect(await inspector.getByRole("columnheader", { name: "Against the plan" }).isVisible()).toBe(false);
    const box = (await line.locator("div").boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
    // The field log reads as cards on a phone: each shift inside the screen, its actions too, the cells named.
    const row = inspector.getByTestId("progress-row").first();
    for (const part of [row, row.getByRole("button", { name: "Delete" })]) {
      const b = (await part.boundingBox())!;
      expect(b.x + b.width).toBeLessThanOrEqual(390);
    }
    const named = await row.locator("td[data-label]:not([data-empty])").evaluateAll((tds) => tds.map((td) => getComputedStyle(td, "::before").content));
    expect(named).toEqual(['"Weather: "', '"Recorded by: "']);
    expect(await seriousA11yViolations(inspector)).toEqual([]);
    await inspector.setViewportSize({ width: 1280, height: 900 });
    expect(await row.locator("td[data-label]").first().evaluate((td) => getComputedStyle(td, "::before").content)).toBe("none");
    expect(await inspector.getByTestId("field-log-csv").getAttribute("href")).toBe(`/api/scenarios/${scenarioId}/exports/field-log.csv`);
    // A day's report, from the date in the log: that day's shifts in sum, printable, with the days either side.
    await inspector.getByTestId("progress-row").first().getByRole("link", { name: formatIsoDate(day(2)) }).click();
    await inspector.getByTestId("daily-report").waitFor();
    expect(await inspector.getByTestId("daily-day").textContent()).toBe(formatIsoDay(day(2), { long: true }));
    expect(await inspector.getByTestId("daily-sum").textContent()).toBe("2 shifts: Mechanical milling 500 ft, Overlay placement 400 ft. 61 °F recorded; no rain; no hours lost.");
    expect(await inspector.getByTestId("daily-shifts").locator("tbody tr").count()).toBe(2);
    // The plan was first run today, long after that day: no forecast stood then.
    expect(await inspector.getByTestId("daily-forecast").textContent()).toBe("Forecast at the end of the dayNo forecast of this scenario had been run by then.");
    expect(await inspector.getByRole("navigation", { name: "Days with shifts" }).textContent()).toBe(`← ${formatIsoDay(day(1))}Back to the field logNo later shift`);
    await expect.poll(() => log.tab("progress").getAttribute("aria-current")).toBe("page"); // still under the Field log tab
    expect(await seriousA11yViolations(inspector)).toEqual([]);
    await screenshot(inspector, "daily-report");
    // On paper (print media, the brief's width): nothing sticks out of the report.
    await inspector.emulateMedia({ media: "print" });
    expect(await overflowing(inspector, "daily-report")).toEqual([]);
    await inspector.emulateMedia({ media: "screen" });
    // A day that is not a date is said so, and the log's last day shown instead.
    await inspector.goto(`${APP_URL}/scenarios/${scenarioId}/progress/daily?date=2026-02-30`);
    expect(await inspector.getByTestId("daily-report").getByRole("alert").textContent()).toBe(`“2026-02-30” is not a date; showing ${formatIsoDay(day(2), { long: true })} instead.`);
    await log.open("progress");
    await inspector.getByTestId("progress-form").waitFor();
    // Choosing an operation continues it: the next entry starts where its last recorded shift stopped.
    const form = inspector.getByTestId("progress-form");
    await form.locator("#new-operationId").selectOption("overlay");
    expect(await form.locator("#new-fromStationFt").inputValue()).toBe("400");
    expect(await form.locator("#new-toStationFt").inputValue()).toBe("500");
    // Milling reached the deck's end (1,000 ft): a new pass (the next stage's) starts at its beginning.
    await form.locator("#new-operationId").selectOption("milling");
    expect(await form.locator("#new-fromStationFt").inputValue()).toBe("0");
    await screenshot(inspector, "field-log-inspector");
    expect(await seriousA11yViolations(inspector)).toEqual([]);

    const engineer = await signedIn("engineer");
    await new ScenarioPage(engineer, scenarioId).open("progress");
    await engineer.getByTestId("progress-table").waitFor();
    // Three shifts and no re-forecast yet: the field log says they are in no forecast, and asks this engineer.
    expect(await engineer.getByTestId("behind-field").textContent()).toBe("No re-forecast yet: the 3 shifts recorded are in no forecast. Re-forecast above to bring it up to date.");
    await engineer.locator("#reforecast-date").fill(day(2));
    await engineer.locator("#reforecast-iterations").selectOption("500");
    await engineer.getByTestId("reforecast-button").click();
    await engineer.getByTestId("reforecast-done").waitFor({ timeout: 60_000 });
    const drift = engineer.getByTestId("drift-chart");
    await drift.waitFor({ timeout: 15_000 });
    await expect.poll(() => drift.locator("tbody tr").count(), { timeout: 15_000 }).toBe(2);
    // Each forecast says when it was run, and a re-forecast by whom (two of one data date are told apart so).
    const when = "\\d{1,2} \\w{3} \\d{4}, \\d\\d:\\d\\d";
    expect(await drift.locator("tbody tr th").allTextContents()).toEqual([
      expect.stringMatching(new RegExp(`^Planrun ${when}$`)),
      expect.stringMatching(new RegExp(`^${formatIsoDate(day(2))}run ${when} by Dana Whitcomb$`)),
    ]);
    await engineer.getByTestId("reforecast-digest").waitFor();
    // Nothing inspected yet (no shift of the operation that finds deterioration): the plan's rate stands, said so.
    expect(await engineer.getByTestId("reforecast-digest").textContent()).toMatch(/: 3 shifts used; no packet inspected yet, so the plan's mean discovery probability \(\d+\.\d %\) stands\.$/);
    // The re-forecast from day 2 knows all three shifts.
    expect(await engineer.getByTestId("behind-field").count()).toBe(0);
    await screenshot(engineer, "forecast-drift");
    expect(await seriousA11yViolations(engineer)).toEqual([]);

    // The newest row is day 2's overlay; deleting it (after the confirmation) keeps it on record.
    const newest = engineer.getByTestId("progress-row").first();
    expect(await newest.textContent()).toContain("Overlay placement");
    let asked = "";
    engineer.once("dialog", (d) => {
      asked = d.message();
      void d.accept();
    });
    await newest.getByRole("button", { name: "Delete" }).click();
    await expect.poll(() => engineer.getByTestId("progress-row").count(), { timeout: 15_000 }).toBe(2);
    // Out of the log, out of the progress: overlay is back to nothing done.
    await expect.poll(() => engineer.getByTestId("progress-to-date-row").nth(1).textContent()).toMatch(/^Overlay placement0 ft of 1,000 ft0 %0———(On plan|[\d,]+ ft behind — not started; the plan had begun)$/);
    expect(asked).toMatch(/^Delete the Overlay placement entry of .+\? It stays on record under "Deleted shifts"/);
    const deleted = engineer.getByTestId("deleted-shifts");
    await deleted.locator("summary").click();
    expect(await deleted.locator("summary").textContent()).toBe("Deleted shifts (1) — kept on record, not in any new forecast");
    expect(await deleted.getByTestId("field-log-csv-with-deleted").getAttribute("href")).toBe(`/api/scenarios/${scenarioId}/exports/field-log.csv?deleted=include`);
    expect(await deleted.getByTestId("deleted-shift").textContent()).toMatch(/Overlay placement.*Rosa Tenney.*Dana Whitcomb, /);
    expect(await engineer.getByTestId("behind-field").textContent()).toMatch(/: 1 change in the field log is not in it — shifts worked after its data date, recorded or corrected since it was run, or deleted since\./);
    await screenshot(engineer, "field-log-deleted-shift");
    expect(await seriousA11yViolations(engineer)).toEqual([]);
    // Put back: the shift returns to the log as recorded; nothing is left under "Deleted shifts".
    await deleted.getByRole("button", { name: /^Put back the Overlay placement entry of / }).click();
    await expect.poll(() => engineer.getByTestId("progress-row").count(), { timeout: 15_000 }).toBe(3);
    expect(await engineer.getByTestId("deleted-shifts").count()).toBe(0);
    expect(await engineer.getByTestId("progress-row").first().textContent()).toContain("Rosa Tenney");
  });
});

describe("shifts loaded from a file", () => {
  it("an inspector loads a site spreadsheet into a field log: a bad row is named by its line, the good file is checked, then loads whole", async () => {
    const scheduler = await signInAs("scheduler");
    const id = (await createPastScenario(scheduler, (await kestrelProject(scheduler)).id, "E2E field log from a file")).id;
    const page = await signedIn("inspector");
    await new ScenarioPage(page, id).open("progress");
    const box = page.getByTestId("import-shifts");
    await box.getByText("Load shifts from a file (CSV)").click();
    const file = (rows: string[]) => ({ name: "site-log.csv", mimeType: "text/csv", buffer: Buffer.from(["Work date,Shift,Operation name,Station from,Station to,Rain", ...rows].join("\n")) });
    const good = [`${day(1)},Day shift,Mechanical milling,0+00,2+00,no`, `${day(2)},Day shift,Mechanical milling,2+00,4+00,yes`];
    await box.locator("input[type=file]").setInputFiles(file([...good, `${day(3)},Day shift,Planing,4+00,5+00,no`]));
    await box.getByRole("button", { name: "Check the file" }).click();
    const problems = page.getByTestId("upload-errors");
    await problems.waitFor();
    expect(await problems.textContent()).toContain("The file has 1 problem; nothing was imported.");
    expect(await problems.textContent()).toContain("row 4 · operation_name: “Planing” is not an operation of this plan");
    expect(await box.getByRole("button", { name: /^Load the/ }).count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await box.locator("input[type=file]").setInputFiles(file(good));
    await box.getByRole("button", { name: "Check the file" }).click();
    // What it would add, before anything is stored: the log is still empty.
    const preview = box.getByTestId("import-shifts-preview");
    await preview.waitFor();
    expect(await preview.textContent()).toContain(`The file holds 2 shifts, worked ${formatIsoDate(day(1))} to ${formatIsoDate(day(2))}`);
    expect(await preview.getByRole("row", { name: /Mechanical milling/ }).textContent()).toContain("400 ft");
    expect(await preview.textContent()).toContain("1 shift with rain; 0 discovered conditions.");
    expect(await page.getByText("2 shifts recorded.").count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "field-log-file-checked");
    await box.getByRole("button", { name: "Load the 2 shifts" }).click();
    await expect.poll(() => box.getByTestId("import-shifts-done").textContent().catch(() => "")).toBe(
      `Loaded 2 shifts, worked ${formatIsoDate(day(1))} to ${formatIsoDate(day(2))}. The forecast knows them from the next re-forecast.`,
    );
    // The log lists them at once.
    await expect.poll(() => page.getByText("2 shifts recorded.").count()).toBe(1);
    await screenshot(page, "field-log-loaded-from-a-file");
  });
});
