/**
 * A plan search shared by link, in Debian's Chromium: the engineer makes a read-only link on the search's
 * page; a visitor with no session sees the same plans (chart and table) and nothing to save or cancel, usable
 * with a screen reader (axe: no serious findings); revoked, the link shows "This link is not available".
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, mainDemoVariant, signInAs } from "../helpers/app";
import { newSearch, uniq } from "../helpers/authz-world";
import { waitForJob } from "../helpers/jobs";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { signedIn } from "./pages/sign-in";
import { SearchPage, SharedSearchPage } from "./pages/search";

const browser = browserPerFile();
let scenarioId: string;
let searchId: string;
let variants: number;

beforeAll(async () => {
  const cookie = await signInAs("engineer");
  scenarioId = await mainDemoVariant(cookie, uniq("E2E search share"));
  searchId = await newSearch(scenarioId, cookie);
  const search = await call(`/api/searches/${searchId}`, { cookie });
  expect((await waitForJob(search.body.search.jobId, cookie, { timeoutMs: 180_000 })).status).toBe("completed");
  variants = (await call(`/api/searches/${searchId}`, { cookie })).body.variants.length;
}, 240_000);

describe("a plan search shared by link", { timeout: 120_000 }, () => {
  it("opens read-only without signing in, reads with a screen reader, and is gone once revoked", async () => {
    const { context, page } = await signedIn(browser(), "engineer");
    const search = new SearchPage(page, scenarioId, searchId);
    await search.open();
    await search.table().waitFor();
    const url = await search.createShareLink("County board");
    expect(url).toMatch(/\/shared-search\/[A-Za-z0-9_-]{43}$/);
    expect(await seriousA11yViolations(page)).toEqual([]);

    const anonymous = await browser().newContext();
    const visitor = new SharedSearchPage(await anonymous.newPage());
    const res = await visitor.open(url);
    expect(res?.status()).toBe(200);
    await visitor.title().waitFor();
    await visitor.table().waitFor();
    expect(await visitor.rows().count()).toBe(variants);
    // Read-only: nothing to save, cancel or sign out of.
    expect(await visitor.page.getByRole("button", { name: /Save as scenario|Cancel|Sign out/ }).count()).toBe(0);
    expect(await visitor.page.getByTestId("frontier-chart").count()).toBe(1);
    // The table still sorts for the visitor (a header is a button).
    await visitor.page.getByRole("button", { name: /Delay/ }).click();
    expect(await visitor.table().locator("th[aria-sort=ascending], th[aria-sort=descending]").count()).toBe(1);
    await screenshot(visitor.page, "shared-search");
    expect(await seriousA11yViolations(visitor.page)).toEqual([]);

    await search.revoke("County board");
    const token = url.split("/shared-search/")[1];
    await expect.poll(async () => (await call(`/api/shared-search/${token}`, { cookie: null })).status, { timeout: 10_000 }).toBe(404);
    const gone = await visitor.open(url);
    expect(gone?.status()).toBe(404);
    await visitor.notAvailable().waitFor();
    await anonymous.close();
    await context.close();
  });
});
