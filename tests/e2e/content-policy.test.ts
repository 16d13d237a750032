/**
 * The page's content security policy as a browser enforces it (src/lib/http/security-headers.ts): scripts run
 * only with their answer's nonce and nothing may eval. Signed in as a scheduler in Debian's Chromium, every
 * main page is opened and a forecast is run in the browser's engine workers; each page hydrates and the run
 * completes. A page whose scripts lacked the nonce would not hydrate. Violations the browser reports (a
 * library probing for eval, say) fail this test, as every e2e test, through tests/e2e/setup.ts.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL, kestrelProject, mainDemoVariant, signInAs } from "../helpers/app";
import { browserPerFile } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";

const browser = browserPerFile();
let projectId: string;
let scenarioId: string;

beforeAll(async () => {
  const cookie = await signInAs("scheduler");
  projectId = (await kestrelProject(cookie)).id;
  scenarioId = await mainDemoVariant(cookie, "E2E content policy");
}, 60_000);

describe("content security policy in the browser", () => {
  it("every main page hydrates under the policy and a browser run completes", async () => {
    const { context, page } = await signedIn(browser(), "scheduler");
    const pages = ["/projects", `/projects/${projectId}`, `/projects/${projectId}/compare`, `/scenarios/${scenarioId}/plan`, `/scenarios/${scenarioId}/progress`, `/scenarios/${scenarioId}/look-ahead`, `/scenarios/${scenarioId}/search`, `/scenarios/${scenarioId}/brief`, `/reset`];
    for (const path of pages) {
      await page.goto(`${APP_URL}${path}`, { waitUntil: "networkidle" });
      // Hydrated: React has attached to the page's root (a page whose scripts were blocked stays bare HTML).
      await expect.poll(() => page.evaluate(() => Object.keys(document.body).some((k) => k.startsWith("__react"))), { timeout: 15_000 }).toBe(true);
    }
    await page.goto(`${APP_URL}/scenarios/${scenarioId}`, { waitUntil: "networkidle" });
    await page.getByLabel("Iterations").selectOption("1000");
    await page.getByTestId("start-run").click();
    const bar = page.getByTestId("run-progress");
    await bar.waitFor();
    await expect.poll(() => bar.getAttribute("aria-valuenow"), { timeout: 90_000 }).toBe("100");
    await context.close();
  }, 180_000);
});
