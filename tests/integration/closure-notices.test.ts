/**
 * Publishing a closure plan: subscribers get a notice through the outbox and the local mail catcher, and the
 * calendar feed behind it is public, parses as iCalendar and dies with its link.
 */
import { beforeAll, describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { format, parse } from "date-fns";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { findMail } from "../../src/lib/server/mailbox";
import { serverRunDone, waitForJob } from "../helpers/jobs";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { isoDaysFromToday } from "../helpers/progress-fixture";
import { localToUtc } from "../../src/lib/exports/closures";
import { formatIsoDay } from "../../src/lib/format";
import { todayIn } from "../../src/lib/progress-schema";

let engineer: string;
let viewer: string;
let projectId: string;
let scenarioId: string;
let timeZone: string;
const subscriber = `pio-${Date.now()}@marrin-county.example`;

beforeAll(async () => {
  // A project of its own: on the demo project, the publications of the files running beside this one (the
  // authorization matrix publishes to every subscriber it adds) could use up the hourly e-mail quota of the demo
  // engineer and project, and this file's publications would be refused depending on the order files ran in.
  const db = appDatabase();
  const team = await freshTeam(db, ["engineer", "viewer"]);
  await db.end({ timeout: 5 });
  projectId = team.projectId;
  [engineer, viewer] = await Promise.all(team.members.map((m) => m.cookie()));
  const admin = await signInAs("admin");
  const base = await demoDefinition(admin, (await kestrelProject(admin)).id);
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
    expect(res.status, JSON.stringify(res.body)).toBe(201);
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

  it("publishes the newest forecast — a re-forecast after the plan run — and every earlier feed and advisory follows the newest publication still standing", async () => {
    const feedOf = async (path: string) => {
      const res = await call(path);
      expect(res.status).toBe(200);
      return new ICAL.Component(ICAL.parse(res.body as string))
        .getAllSubcomponents("vevent")
        .map((e) => (e.getFirstPropertyValue("dtstart") as ICAL.Time).toString())
        .join(" ");
    };
    const publish = async () => {
      const preview = await call(`/api/scenarios/${scenarioId}/closure-publications?preview=1`, { cookie: engineer });
      expect(preview.status).toBe(200);
      const res = await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: engineer, body: { runId: preview.body.preview.runId } });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return { preview: preview.body.preview, feedPath: new URL(res.body.feedUrl).pathname, advisoryPath: new URL(res.body.advisoryUrl).pathname };
    };
    const first = await publish();
    expect(first.preview.source).toMatch(/^Forecast run /);
    const firstFeed = await feedOf(first.feedPath);
    let listed = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer });
    expect(listed.body.lag).toBeNull();

    // A plan edit that moves no work (its description) run with the same seed: a newer forecast with the very
    // same closures — the public's notice still holds, and the Share page does not ask for another.
    const current = (await call(`/api/scenarios/${scenarioId}`, { cookie: engineer })).body.scenario;
    const edited = { name: current.name, definition: { ...current.definition, description: "Closures checked with the county." }, version: current.version };
    expect((await call(`/api/scenarios/${scenarioId}`, { method: "PUT", cookie: engineer, body: edited })).status).toBe(200);
    expect((await serverRunDone(scenarioId, engineer, { seed: "notice", iterations: 20 })).status).toBe("completed");
    const again = await call(`/api/scenarios/${scenarioId}/closure-publications?preview=1`, { cookie: engineer });
    expect(again.body.preview.runId).not.toBe(first.preview.runId);
    listed = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer });
    expect(listed.body.lag).toBeNull();

    // A re-forecast from yesterday with nothing in this scenario's field log: every operation starts over from
    // today, so its closures are not the plan run's. It is now the newest forecast, and the Share page says the
    // published closures lag it.
    const re = await call(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: isoDaysFromToday(-1, timeZone), seed: "notice", iterations: 20 } });
    expect(re.status).toBe(202);
    expect((await waitForJob(re.body.job.id, engineer)).status).toBe("completed");
    listed = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer });
    expect(listed.body.lag.newest).toMatch(/^Re-forecast from the field log as of /);
    expect(listed.body.lag.published).toBe(listed.body.publications[0].source);
    expect(listed.body.lag.newestStale).toBe(false);
    // What a new notice would change, in numbers and with the first day that differs (from today on, where the work is).
    expect(listed.body.lag.changes).toMatch(
      /^(The newest forecast has [\d,]+ closures? the public has not been told of from today on|[\d,]+ of the [\d,]+ closures? published from today on (is|are) not in the newest forecast(, which has [\d,]+ closures? the public has not been told of)?); the first difference is on \w{3} \d{1,2} \w{3} \d{4}\.$/,
    );
    const firstDay = format(parse(listed.body.lag.changes.match(/on (\w{3} \d{1,2} \w{3} \d{4})\.$/)[1], "EEE d MMM yyyy", new Date()), "yyyy-MM-dd");
    expect(firstDay >= todayIn(timeZone)).toBe(true);

    const second = await publish();
    expect(second.preview.source).toBe(`${listed.body.lag.newest}.`);
    expect((await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer })).body.lag).toBeNull();
    const secondFeed = await feedOf(second.feedPath);
    expect(secondFeed).not.toBe(firstFeed);
    // The notice promises that the calendar follows each new publication: the first feed now carries the second's closures.
    expect(await feedOf(first.feedPath)).toBe(secondFeed);

    // Revoking the second publication's link withdraws it: the first feed falls back to the first publication.
    const links = await call(`/api/scenarios/${scenarioId}/share-links`, { cookie: engineer });
    const secondToken = second.feedPath.split("/")[3];
    // The list is newest first: the second publication's feed link heads the feed links still standing.
    const newestLink = links.body.links.find((l: { label: string; revokedAt: string | null }) => l.label === "Closure calendar feed" && !l.revokedAt);
    expect((await call(`/api/share-links/${newestLink.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    expect((await call(`/api/shared/${secondToken}/closures.ics`)).status).toBe(404);
    expect(await feedOf(first.feedPath)).toBe(firstFeed);
    listed = await call(`/api/scenarios/${scenarioId}/closure-publications`, { cookie: engineer });
    expect(listed.body.publications[0].withdrawn).toBe(true);
    expect(listed.body.publications[1].withdrawn).toBe(false);
    // What stands again is the first publication, of the plan run: behind the re-forecast, and said so.
    expect(listed.body.lag.published).toMatch(/^Forecast run /);
  });

  it("a viewer can neither see the subscriber list nor publish", async () => {
    expect((await call(`/api/projects/${projectId}/closure-subscribers`, { cookie: viewer })).status).toBe(403);
    expect((await call(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", cookie: viewer })).status).toBe(403);
  });
});
