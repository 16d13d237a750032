/**
 * Pages and server actions, for every caller of the API matrix. Every page under src/app/(app) must have a row
 * (found from its page.tsx files); the answer of each cell is derived from the row's need: not signed in → sent
 * to the sign-in page, a project the caller is not in → 404, a role the page is not for → 403 with the page that
 * says the role cannot do this (a member is not told "not found"), otherwise 200.
 * Server actions are found by their "use server" files and called over HTTP like the framework's client.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { can, type Action } from "@/lib/permissions";
import { discoverAppPages, fillPath } from "../helpers/route-inventory";
import { buildWorld, CALLERS, isRole, present, tokenOf, unknownToken, type Caller, type World } from "../helpers/authz-world";
import { findMail } from "../../src/lib/server/mailbox";

type PageNeed = { kind: "session" } | { kind: "project" | "scenario"; action: Action } | { kind: "mailbox" };

const PAGE_ROWS: Record<string, PageNeed> = {
  "/projects": { kind: "session" },
  "/projects/new": { kind: "session" },
  "/account": { kind: "session" },
  "/projects/[projectId]": { kind: "project", action: "read" },
  "/projects/[projectId]/compare": { kind: "project", action: "read" },
  "/projects/[projectId]/members": { kind: "project", action: "manageMembers" },
  "/projects/[projectId]/scenarios/new": { kind: "project", action: "editScenario" },
  "/scenarios/[scenarioId]": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/plan": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/brief": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/progress": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/progress/daily": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/data": { kind: "scenario", action: "editScenario" },
  "/scenarios/[scenarioId]/share": { kind: "scenario", action: "shareScenario" },
  // The week ahead: every member reads the board (the notice settings are shown only to those who may share).
  "/scenarios/[scenarioId]/look-ahead": { kind: "scenario", action: "read" },
  // Plan search: everyone who reads the scenario sees its searches (the form only for those who may run it).
  "/scenarios/[scenarioId]/search": { kind: "scenario", action: "read" },
  "/scenarios/[scenarioId]/search/[searchId]": { kind: "scenario", action: "read" },
  // The local mail catcher: whether it is switched on is the machine owner's choice, but it never shows anyone
  // mail addressed to someone else (checked below).
  "/dev/mailbox": { kind: "mailbox" },
};

type PageAnswer = "signin" | 200 | 403 | 404 | "200 or 404";
const signedIn = (c: Caller) => isRole(c) || c === "otherProjectAdmin";

function expectedPage(need: PageNeed, c: Caller): PageAnswer {
  if (!signedIn(c)) return "signin";
  if (need.kind === "session") return 200;
  if (need.kind === "mailbox") return "200 or 404";
  if (!isRole(c)) return 404;
  return can(c, need.action) ? 200 : 403;
}

const pages = discoverAppPages();
let w: World;
const probe = { email: `mailbox-probe-${Date.now()}@authz.example`, resetLink: "" };

beforeAll(async () => {
  w = await buildWorld();
  // A reset e-mail to an account none of the callers owns: nobody here may see it in the mail catcher.
  await w.db`INSERT INTO users (id, email, name, password_hash) VALUES (${crypto.randomUUID()}, ${probe.email}, 'Mailbox probe', NULL)`;
  expect((await call("/api/auth/password-reset", { method: "POST", body: { email: probe.email } })).status).toBe(200);
  // The outbox poller sends every 2 s; 20 s is ten passes.
  for (const until = Date.now() + 20_000; !findMail({ to: probe.email }) && Date.now() < until; ) await new Promise((r) => setTimeout(r, 250));
  probe.resetLink = new URL(findMail({ to: probe.email })!.text.match(/https?:\/\/\S+\/reset\/\S+/)![0]).pathname;
}, 120_000);
afterAll(async () => {
  await w?.db.end();
});

describe("the page table covers the app", () => {
  it("every page under src/app/(app) has a row, and every row a page", () => {
    expect(pages.length).toBeGreaterThan(10);
    expect(pages.filter((p) => !(p in PAGE_ROWS)), "pages without a row").toEqual([]);
    expect(Object.keys(PAGE_ROWS).filter((p) => !pages.includes(p)), "rows without a page").toEqual([]);
  });
});

describe.each(pages.filter((p) => p in PAGE_ROWS))("page %s", (template) => {
  it.each(CALLERS)("as %s", async (caller) => {
    const want = expectedPage(PAGE_ROWS[template], caller);
    const url = fillPath(template, { projectId: w.projectId, scenarioId: w.target.id, searchId: w.searchId });
    const [path, opts] = present(w, caller, url);
    const res = await call(path, opts);
    const where = `${url} as ${caller}: ${res.status} ${res.headers.get("location") ?? ""}`;
    if (want === "signin") {
      expect([303, 307, 308], where).toContain(res.status);
      expect(new URL(res.headers.get("location")!, "http://x").pathname, where).toBe("/signin");
    } else if (want === "200 or 404") {
      expect([200, 404], where).toContain(res.status);
    } else {
      expect(res.status, where).toBe(want);
    }
    if (want === 403) expect(String(res.body), `${where}: says the role cannot do this`).toContain("Your role on this project cannot do this");
    if (PAGE_ROWS[template].kind === "mailbox") {
      const html = String(res.body);
      expect(html.includes(probe.email), `${where}: shows mail addressed to someone else`).toBe(false);
      expect(html.includes(probe.resetLink), `${where}: shows someone else's reset link`).toBe(false);
    }
  });
});

describe("the public shared page", () => {
  it.each(CALLERS)("/shared/<token> as %s: a share link opens it, a calendar-feed token does not", async (caller) => {
    const token = tokenOf(w, caller);
    const res = await call(`/shared/${token ?? unknownToken()}`, { cookie: isRole(caller) ? w.cookies[caller] : null });
    expect(res.status, `as ${caller}`).toBe(caller === "shareLink" ? 200 : 404);
  });
});

describe("the public shared search page", () => {
  it.each(CALLERS)("/shared-search/<token> as %s: only a link to that search opens it", async (caller) => {
    const token = tokenOf(w, caller);
    const res = await call(`/shared-search/${token ?? unknownToken()}`, { cookie: isRole(caller) ? w.cookies[caller] : null });
    expect(res.status, `as ${caller}`).toBe(caller === "searchLink" ? 200 : 404);
  });
});

describe("the public travel advisory", () => {
  it.each(CALLERS)("/advisory/<token> as %s: a closure publication's token opens it, nothing else does", async (caller) => {
    const token = tokenOf(w, caller);
    const res = await call(`/advisory/${token ?? unknownToken()}`, { cookie: isRole(caller) ? w.cookies[caller] : null });
    expect(res.status, `as ${caller}`).toBe(caller === "feedToken" ? 200 : 404);
  });
});
