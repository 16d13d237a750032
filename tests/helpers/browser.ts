/** Debian's Chromium driven by playwright-core; no browser is ever downloaded. */
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { mkdirSync } from "node:fs";
import { fileURLToPath } from "node:url";
import AxeBuilder from "@axe-core/playwright";
import { afterAll, beforeAll } from "vitest";

export const SCREENSHOTS = fileURLToPath(new URL("../e2e/screenshots/", import.meta.url));

/**
 * Every browser context the tests open reports the content-security-policy violations its pages raise
 * (src/lib/http/security-headers.ts) here; tests/e2e/setup.ts fails the test that caused any. A page whose
 * own scripts the policy blocked, or a library that probes for eval, shows up in every e2e test this way.
 */
const policyViolations: string[] = [];

/** The violations reported since the last call, emptied. */
export function takePolicyViolations(): string[] {
  return policyViolations.splice(0);
}

async function watchPolicy(context: BrowserContext): Promise<void> {
  await context.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => console.error(`policy violation: ${e.violatedDirective} ${e.blockedURI || "(inline)"}`));
  });
  context.on("console", (m) => {
    if (m.text().startsWith("policy violation:") || /Content Security Policy/.test(m.text())) policyViolations.push(`${m.page()?.url() ?? "?"}: ${m.text()}`);
  });
}

/**
 * One Chromium for an e2e file: launched before the file's tests, closed after them. Called once at the top of the
 * file; what it returns gives the running browser.
 */
export function browserPerFile(): () => Browser {
  let browser: Browser | null = null;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error("the file's browser is launched in beforeAll");
    return browser;
  };
}

export async function launch(): Promise<Browser> {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-dev-shm-usage"],
  });
  // Wrapped so that no test can open a context the policy watch misses.
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (options) => {
    const context = await newContext(options);
    await watchPolicy(context);
    return context;
  };
  return browser;
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(SCREENSHOTS, { recursive: true });
  await page.screenshot({ path: `${SCREENSHOTS}${name}.png`, fullPage: true });
}

/** axe-core's serious and critical findings on the current page, as readable lines. */
export async function seriousA11yViolations(page: Page): Promise<string[]> {
  // Next streams a page's <title> with its metadata, and re-renders it on router.refresh(): give it a moment, so a
  // check right after a refresh does not catch the document between two titles (a page with none still fails).
  await page.waitForFunction(() => document.title.trim() !== "", undefined, { timeout: 5_000 }).catch(() => {});
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(", ")})`);
}

/**
 * Elements inside the print box `[data-testid=<testId>]` (the owner brief, a daily report) whose box ends to the
 * right of it (px over), as readable lines: on paper they would be cut off.
 */
export async function overflowing(page: Page, testId: string): Promise<string[]> {
  return page.evaluate((id) => {
    const box = document.querySelector<HTMLElement>(`[data-testid=${id}]`)!;
    const edge = box.getBoundingClientRect().right;
    const out: string[] = [];
    for (const el of box.querySelectorAll<Element>("*")) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || getComputedStyle(el).display === "none") continue;
      if (el.closest(".sr-only")) continue;
      if (r.right > edge + 1) out.push(`${el.tagName.toLowerCase()}.${String(el.getAttribute("class") ?? "").slice(0, 40)} ends ${Math.round(r.right - edge)} px past the ${id}`);
    }
    return out.slice(0, 10);
  }, testId);
}
