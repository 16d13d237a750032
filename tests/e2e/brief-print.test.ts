/**
 * The owner brief printed, as an owner would print it: Chromium renders it to PDF on Letter and on A4, and the
 * PDF is read back page by page (pdfjs-dist). Before printing, nothing inside the brief may stick out of its
 * print box (the progress-to-date table of its two recorded shifts among it) and nothing clickable may show; in the PDF every chart is there with its last date label (the
 * time–distance chart to the season-2 finish), there are no sort arrows or buttons, and the iteration count is
 * stated, with the warning a 200-iteration forecast deserves. The traffic section prints whole: the closure
 * plan, the longest backups (the run's longest queue among them), the days over the plan's queue limit, the
 * holiday trade-off computed on the run's seed (every row of it), and the work-zone safety caution.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { call, mainDemoVariant, signInAs } from "../helpers/app";
import { serverRunDone } from "../helpers/jobs";
import { browserPerFile, overflowing } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";
import { formatIsoDate } from "@/lib/format";

const browser = browserPerFile();
let scenarioId: string;
let shiftDates: string[];

// Printable widths in CSS px (96 per inch) with the brief's 12 mm margins on each side.
const MM = 96 / 25.4;
const FORMATS = [
  { format: "Letter", printableWidth: 8.5 * 96 - 24 * MM },
  { format: "A4", printableWidth: 210 * MM - 24 * MM },
] as const;

beforeAll(async () => {
  const cookie = await signInAs("engineer");
  scenarioId = await mainDemoVariant(cookie, "E2E brief print");
  // Two shifts in its field log, so the brief carries "Progress to date" (which must fit the paper like the rest).
  const start = (await call(`/api/scenarios/${scenarioId}`, { cookie })).body.scenario.definition.startDate as string;
  shiftDates = [1, 2].map((n) => new Date(Date.parse(`${start}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10));
  for (const [workDate, fromStationFt, toStationFt] of [[shiftDates[0], 1200, 1600], [shiftDates[1], 1600, 2000]] as const) {
    const shift = { workDate, shift: "night", operationId: "setup", fromStationFt, toStationFt, crew: "Traffic control crew" };
    expect((await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie, body: shift })).status).toBe(201);
  }
  // A small run (the server computes it): few enough iterations that the brief must warn.
  expect((await serverRunDone(scenarioId, cookie, { seed: "brief", iterations: 200 })).status).toBe("completed");
}, 180_000);

async function pagesText(pdf: Buffer): Promise<string[]> {
  const doc = await getDocument({ data: new Uint8Array(pdf), disableFontFace: true, useSystemFonts: false }).promise;
  const out: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    out.push(content.items.map((it) => ("str" in it ? it.str : "")).join(" ").replace(/\s+/g, " "));
  }
  await doc.destroy();
  return out;
}

describe("the owner brief prints whole", () => {
  it.each(FORMATS)("on $format: every chart whole, nothing to click, the iteration count with its warning", async ({ format, printableWidth }) => {
    const { context, page } = await signedIn(browser(), "engineer", 1280);
    const brief = new ScenarioPage(page, scenarioId);
    await brief.open("brief");
    await page.getByTestId("owner-brief").waitFor();
    await page.getByTestId("time-distance-chart").locator("svg").first().waitFor();
    // The holiday trade-off is computed in the browser when the brief opens: print once it has arrived.
    await page.locator("[data-testid=brief-tradeoff][data-state=done]").waitFor({ timeout: 60_000 });
    const tradeoffRows = await page.locator("[data-testid=brief-tradeoff] [data-testid=tradeoff-table] tbody th").allTextContents();
    const closureRows = await page.locator("[data-testid=brief-closure-plan] tbody tr").count();

    // Laid out as the printer will: print media at the paper's printable width.
    await page.emulateMedia({ media: "print" });
    await page.setViewportSize({ width: Math.floor(printableWidth), height: 1000 });
    await page.waitForTimeout(300); // charts re-measure on resize
    const box = await page.getByTestId("owner-brief").boundingBox();
    expect(box!.x + box!.width, "the brief fits the printable width").toBeLessThanOrEqual(printableWidth + 1);
    expect(await overflowing(page, "owner-brief")).toEqual([]);
    const clickable = await page.locator("[data-testid=owner-brief] :is(button, select, input, textarea, [role=button])").evaluateAll((els) => els.filter((e) => (e as HTMLElement).offsetParent !== null).map((e) => e.outerHTML.slice(0, 80)));
    expect(clickable, "nothing clickable prints").toEqual([]);

    // The last date label of the time–distance chart, and the other charts' headings, must reach the paper.
    const tdTicks = await page.locator("[data-testid=time-distance-chart] .recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value").allTextContents();
    expect(tdTicks.length).toBeGreaterThan(2);
    // Every operation's line ends inside the chart's own drawing, which ends inside the page.
    const td = await page.locator("[data-testid=time-distance-chart] svg.recharts-surface").first().evaluate((svg) => {
      const box = svg.getBoundingClientRect();
      const lines = [...svg.querySelectorAll(".recharts-line path")].map((p) => p.getBoundingClientRect()).filter((r) => r.width > 0);
      return { svgRight: box.right, linesRight: Math.max(...lines.map((r) => r.right)), lines: lines.length };
    });
    expect(td.lines).toBeGreaterThan(3);
    expect(td.linesRight).toBeLessThanOrEqual(td.svgRight + 1);
    expect(td.svgRight).toBeLessThanOrEqual(printableWidth + 1);
    const lastTick = tdTicks.at(-1)!.trim();
    const finish = (await page.getByTestId("p80-date").first().textContent())!.trim();

    const pdf = await page.pdf({ format, printBackground: true, margin: { top: "12mm", bottom: "12mm", left: "12mm", right: "12mm" } });
    const pages = await pagesText(pdf);
    const all = pages.join(" ");
    expect(pages.length).toBeGreaterThanOrEqual(2);
    expect(await page.getByTestId("brief-progress").locator("tbody tr").first().textContent()).toBe(`Work-zone setup800 ft of 8,400 ft10 %2—${formatIsoDate(shiftDates[1])}`);
    // Under each row, on paper, where it stands against the plan run's median iteration (a 200-iteration run).
    expect(await page.getByTestId("progress-to-date-against").first().textContent()).toMatch(/^Against the plan: (On plan|[\d,]+ ft (behind|ahead) — .+)$/);
    expect(await page.getByTestId("brief-progress").textContent()).toContain("Against the plan: how far the plan run of");
    for (const heading of ["Owner brief", "Progress to date", "Forecast", "Confidence curve", "Finish dates", "Time–distance", "Delay and cost", "Finish by operation", "Assumptions", "Planning aid, not an approval"]) {
      // Case aside: some headings are set in capitals by the style sheet, and the PDF holds them as shown.
      expect(all.toLowerCase(), `${format}: "${heading}" printed`).toContain(heading.toLowerCase());
    }
    const tdPage = pages.findIndex((p) => p.includes("Time–distance"));
    expect(pages.slice(tdPage, tdPage + 2).join(" "), `${format}: the time–distance chart printed to its last date label "${lastTick}"`).toContain(lastTick);
    expect(all).toContain(finish);

    // The traffic section: closure plan, backups, the days over the limit, the trade-off, the caution.
    const traffic = all.slice(all.toLowerCase().indexOf("traffic and closures"));
    expect(all.toLowerCase(), `${format}: the traffic section printed`).toContain("traffic and closures");
    expect(closureRows, "a row per closure of the plan").toBeGreaterThanOrEqual(2);
    for (const text of ["Closure plan", "When it may stand", "Longest expected backups", "Days over the queue limit of 1 mile of queue", "Holiday trade-off", "Work-zone safety"]) {
      expect(traffic.toLowerCase(), `${format}: "${text}" in the traffic section`).toContain(text.toLowerCase());
    }
    // The run's longest queue heads the backups table, with its date.
    const cookie = await signInAs("engineer");
    const runs = await call(`/api/scenarios/${scenarioId}/runs`, { cookie });
    const run = await call(`/api/runs/${runs.body.runs[0].id}`, { cookie });
    const maxQueue = run.body.run.results.traffic.maxQueue as { miles: number; date: string };
    expect(maxQueue.miles).toBeGreaterThan(0);
    expect(await page.locator("[data-testid=brief-backups] tbody tr").first().locator("td").first().textContent()).toBe(maxQueue.miles.toFixed(1));
    expect(traffic).toContain(maxQueue.miles.toFixed(1));
    // Every row of the trade-off table reached the paper, with the sentence that states it.
    expect(tradeoffRows).toEqual(expect.arrayContaining(["Finish (P50 / P80)", "Chance of meeting the target", "Delay to drivers, vehicle-hours (P50 / P80)", "Longest holiday backup (P50 / P80)", "Road-user cost (P50 / P80)", "Contract cost (P50 / P80)"]));
    // A label wrapped in its cell reads back with a space at the break ("vehicle- hours"): compare without spaces.
    const squash = (x: string) => x.replace(/\s+/g, "");
    for (const row of tradeoffRows) expect(squash(traffic), `${format}: trade-off row "${row}" printed`).toContain(squash(row));
    expect(traffic).toMatch(/Working through holidays finishes/);
    expect(traffic).not.toContain("Wait for this line");
    expect(all).toContain("This forecast rests on 200 simulated outcomes");
    expect(all).toContain("fewer than the 1,000 a brief should rest on");
    for (const p of pages) {
      expect(p, `${format}: no sort arrows or buttons on paper`).not.toMatch(/[↕▲▼]|Print or save as PDF|Compare holiday policies|Run the comparison/);
    }
    await context.close();
  }, 120_000);
});
