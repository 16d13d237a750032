/**
 * The owner brief printed, as an owner would print it: Chromium renders it to PDF on Letter and on A4, and the
 * PDF is read back page by page (pdfjs-dist). Before printing, nothing inside the brief may stick out of its
 * print box and nothing clickable may show; in the PDF every chart is there with its last date label (the
 * time–distance chart to the season-2 finish), there are no sort arrows or buttons, and the iteration count is
 * stated, with the warning a 200-iteration forecast deserves.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { serverRunDone } from "../helpers/jobs";
import { launch } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { ScenarioPage } from "./pages/scenario";

let browser: Browser;
let scenarioId: string;

// Printable widths in CSS px (96 per inch) with the brief's 12 mm margins on each side.
const MM = 96 / 25.4;
const FORMATS = [
  { format: "Letter", printableWidth: 8.5 * 96 - 24 * MM },
  { format: "A4", printableWidth: 210 * MM - 24 * MM },
] as const;

beforeAll(async () => {
  browser = await launch();
  const cookie = await signInAs("engineer");
  const projectId = (await kestrelProject(cookie)).id;
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie });
  const main = list.body.scenarios.find((s: { name: string }) => s.name === "Kestrel Bay Causeway — two seasons");
  const variant = await call(`/api/scenarios/${main.id}/variants`, { method: "POST", cookie, body: { name: "E2E brief print" } });
  scenarioId = variant.body.id;
  // A small run (the server computes it): few enough iterations that the brief must warn.
  expect((await serverRunDone(scenarioId, cookie, { seed: "brief", iterations: 200 })).status).toBe("completed");
}, 180_000);
afterAll(async () => {
  await browser?.close();
});

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

/** Elements inside the brief whose box ends to the right of the brief's own box (px over), as readable lines. */
async function overflowing(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const brief = document.querySelector<HTMLElement>("[data-testid=owner-brief]")!;
    const edge = brief.getBoundingClientRect().right;
    const out: string[] = [];
    for (const el of brief.querySelectorAll<Element>("*")) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || getComputedStyle(el).display === "none") continue;
      if (el.closest(".sr-only")) continue;
      if (r.right > edge + 1) out.push(`${el.tagName.toLowerCase()}.${String(el.getAttribute("class") ?? "").slice(0, 40)} ends ${Math.round(r.right - edge)} px past the brief`);
    }
    return out.slice(0, 10);
  });
}

describe("the owner brief prints whole", () => {
  it.each(FORMATS)("on $format: every chart whole, nothing to click, the iteration count with its warning", async ({ format, printableWidth }) => {
    const { context, page } = await signedIn(browser, "engineer", 1280);
    const brief = new ScenarioPage(page, scenarioId);
    await brief.open("brief");
    await page.getByTestId("owner-brief").waitFor();
    await page.getByTestId("time-distance-chart").locator("svg").first().waitFor();

    // Laid out as the printer will: print media at the paper's printable width.
    await page.emulateMedia({ media: "print" });
    await page.setViewportSize({ width: Math.floor(printableWidth), height: 1000 });
    await page.waitForTimeout(300); // charts re-measure on resize
    const box = await page.getByTestId("owner-brief").boundingBox();
    expect(box!.x + box!.width, "the brief fits the printable width").toBeLessThanOrEqual(printableWidth + 1);
    expect(await overflowing(page)).toEqual([]);
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
    for (const heading of ["Owner brief", "Forecast", "Confidence curve", "Finish dates", "Time–distance", "Delay and cost", "Finish by operation", "Assumptions", "Planning aid, not an approval"]) {
      // Case aside: some headings are set in capitals by the style sheet, and the PDF holds them as shown.
      expect(all.toLowerCase(), `${format}: "${heading}" printed`).toContain(heading.toLowerCase());
    }
    const tdPage = pages.findIndex((p) => p.includes("Time–distance"));
    expect(pages.slice(tdPage, tdPage + 2).join(" "), `${format}: the time–distance chart printed to its last date label "${lastTick}"`).toContain(lastTick);
    expect(all).toContain(finish);
    expect(all).toContain("This forecast rests on 200 simulated outcomes");
    expect(all).toContain("fewer than the 1,000 a brief should rest on");
    for (const p of pages) {
      expect(p, `${format}: no sort arrows or buttons on paper`).not.toMatch(/[↕▲▼]|Print or save as PDF|Compare holiday policies|Run the comparison/);
    }
    await context.close();
  }, 120_000);
});
