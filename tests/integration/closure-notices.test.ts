/**
 * Publishing a closure plan: subscribers get a notice through the outbox and the local mail catcher, and the
 * calendar feed behind it is public, parses as iCalendar and dies with its link.
 */
import { beforeAll, describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { findMail } from "../../src/lib/server/mailbox";
import { serverRunDone } from "../helpers/jobs";
import { localToUtc } from "../../src/lib/exports/closures";
import { formatIsoDay } from "../../src/lib/format";
import { todayIn } from "../../src/lib/progress-schema";

let engineer: string;
let projectId: string;
let scenarioId: string;
let timeZone: string;
const subscriber = `pio-${Date.now()}@marrin-county.example`;

beforeAll(async () => {
  engineer = await signInAs("engineer");
  projectId = (await kestrelProject(engineer)).id;
  const base = await demoDefinition(engineer, projectId);
  timeZone = base.timeZone;
  const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: engineer, body: { name: "Closure notice plan", definition: { ...base, name: "Closure notice plan" } } });
  scenarioId = created.body.id;
});

async function waitForMail(to: string, subject: string, ms = 20_000) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    const m = findMail({ to, subject });
    if (m) return m;
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no e-mail to ${to} about "${subject}" within ${ms} ms`);
}

describe("closure notices", () => {
  it("refuses to publish (or preview a publication) before the scenario has a current run", async () => {
    const res = await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: engineer });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/Run the scenario/);
    expect((await call(`/api/scenarios/${scenarioId}/closure-publications?preview=1`, { cookie: engineer })).status).toBe(409);
  });

  it("a subscriber's e-mail is validated and a repeat add changes nothing", async () => {
    const bad = await call(`/api/projects/${projectId}/closure-subscribers`, { method: "POST", cookie: engineer, body: { email: "not-an-address" } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].path).toBe("email");
    for (let i = 0; i < 2; i++) expect((await call(`/api/projects/${projectId}/closure-subscribers`, { method: "POST", cookie: engineer, body: { email: subscriber, label: "County public information office" } })).status).toBe(201);
    const list = await call(`/api/projects/${projectId}/closure-subscribers`, { cookie: engineer });
    expect(list.body.subscribers.filter((s: { email: string }) => s.email === subscriber)).toHaveLength(1);
  });

  it("publishing notifies every subscriber with the closures from today on and a calendar feed that parses and can be revoked", async () => {
    expect((await serverRunDone(scenarioId, engineer, { seed: "notice", iterations: 20 })).status).toBe("completed");
    // The confirmation first shows what will be sent; publishing sends exactly that, with the new calendar link.
    const preview = await call(`/api/scenarios/${scenarioId}/closure-publications?preview=1`, { cookie: engineer });
    expect(preview.status).toBe(200);
    expect(preview.body.preview.to).toContain(subscriber);
    // Publishing names the previewed run, as the Share page's confirmation does.
    const res = await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: engineer, body: { runId: preview.body.preview.runId } });
    expect(res.status).toBe(201);
    expect(res.body.closureCount).toBeGreaterThan(0);
    expect(res.body.notified).toBeGreaterThanOrEqual(1);

    const mail = await waitForMail(subscriber, "Lane closures planned");
    expect(mail.subject).toBe(preview.body.preview.subject);
    expect(preview.body.preview.closureCount).toBe(res.body.closureCount);
    expect(preview.body.preview.runId).toMatch(/^[0-9a-f-]{36}$/);
    expect(mail.text).toBe(
      preview.body.preview.text.replace("(a new calendar link, created when you publish)", res.body.feedUrl).replace("(a new travel advisory link, created when you publish)", res.body.advisoryUrl),
    );
    const feedPath = new URL(res.body.feedUrl).pathname;
    expect(mail.text).toContain(feedPath);

    const feed = await call(feedPath);
    expect(feed.status).toBe(200);
    expect(feed.headers.get("content-type")).toMatch(/text\/calendar/);
    const events = new ICAL.Component(ICAL.parse(feed.body as string)).getAllSubcomponents("vevent");
    expect(events).toHaveLength(res.body.closureCount);
    // The feed carries every closure; the notice counts and lists those that end after today began where the
    // work is (the demo's first season lies in the past on most days this test runs).
    const today = todayIn(timeZone);
    const dayStart = localToUtc(`${today}T00:00`, timeZone).getTime();
    const ahead = events.filter((e) => (e.getFirstPropertyValue("dtend") as ICAL.Time).toJSDate().getTime() > dayStart).length;
    expect(mail.text).toContain(`${ahead === events.length ? "all of them" : ahead.toLocaleString("en-US")} from today (${formatIsoDay(today)}) on.`);
    if (ahead > 0) expect(mail.text).toMatch(/The (next )?closures:\n\w{3} \d{1,2} \w{3} \d{4} \d\d:\d\d – /);
    else expect(mail.text).toContain("No closure is planned from today on.");

    const pubs = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer });
    expect(pubs.body.publications[0].closureCount).toBe(res.body.closureCount);

    // The feed is a share link like any other: revoked, it is gone.
    const links = await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: engineer });
    const feedLink = links.body.links.find((l: { label: string }) => l.label === "Closure calendar feed");
    expect((await call(`/api/share-links/${feedLink.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    expect((await call(feedPath)).status).toBe(404);
  });

  it("a viewer can neither see the subscriber list nor publish", async () => {
    const viewer = await signInAs("viewer");
    expect((await call(`/api/projects/${projectId}/closure-subscribers`, { cookie: viewer })).status).toBe(403);
    expect((await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: viewer })).status).toBe(403);
  });
});
