/**
 * The weekly closure e-mail: the people who publish closures turn it on for a weekday after a local hour; once that
 * day, the week ahead of the project's standing publication goes to its closure-notice subscribers, day by day with
 * the expected backups — once, and only when the week has a closure; a withdrawn publication sends nothing.
 *
 * The pass is called here with chosen clocks a month ahead of the real one, on a weekday the real clock is not on
 * today, so the app's own pass (which runs on the real clock) never takes this project's days from the test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { atLocal, isoDaysFromToday, pastDefinition, plusDays } from "../helpers/progress-fixture";
import { serverRunDone } from "../helpers/jobs";
import { refuseRows } from "../helpers/refuse-rows";
import { formatIsoDate, formatIsoDay } from "@/lib/format";
import { parseIsoDate, weekdayOfDayNumber } from "@sim/dates";
import { sendWeeklyClosureEmails } from "@/lib/server/closure-weekly";

const TZ = "America/Chicago"; // the fixture plan's time zone
// The plan starts a month ahead (30 days: not today's weekday), so its first closures fall in the week from BASE.
const BASE = isoDaysFromToday(30, TZ);
let db: postgres.Sql;
let projectId: string;
let engineer: string;
let viewer: string;
const subscriber = `weekly-${Date.now()}@marrin-county.example`;

const setting = (cookie: string, body: unknown) => call(`/api/projects/${projectId}/closure-weekly`, { method: "PUT", cookie, body });
const ours = async (now: Date) => (await sendWeeklyClosureEmails(now)).filter((d) => d.projectId === projectId);
const mailTo = async (email: string) => db`SELECT subject, text_body FROM email_outbox WHERE to_address = ${email} ORDER BY created_at, id`;

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["engineer", "viewer"]);
  projectId = team.projectId;
  [engineer, viewer] = await Promise.all(team.members.map((m) => m.cookie()));
  await publishWeeklyPlan(projectId, engineer, subscriber);
}, 120_000);

/** A plan starting at BASE, run, with one closure-notice subscriber, published. */
async function publishWeeklyPlan(project: string, cookie: string, email: string) {
  const definition = { ...pastDefinition("Weekly closures plan"), startDate: BASE };
  const created = await call(`/api/projects/${project}/scenarios`, { method: "POST", cookie, body: { name: "Weekly closures plan", definition } });
  expect(created.status).toBe(201);
  expect((await serverRunDone(created.body.id, cookie, { seed: "weekly", iterations: 20 })).status).toBe("completed");
  expect((await call(`/api/projects/${project}/closure-subscribers`, { method: "POST", cookie, body: { email, label: "County PIO" } })).status).toBe(201);
  expect((await call(`/api/scenarios/${created.body.id}/closure-publications`, { method: "POST", cookie })).status).toBe(201);
}

afterAll(async () => {
  await db?.end({ timeout: 5 });
});

describe("weekly closure e-mail", () => {
  it("is set by a weekday and an hour, or turned off; bad values are refused naming the field; a viewer may not", async () => {
    const bad = await setting(engineer, { closureWeeklyDay: 7, closureWeeklyHour: 6 });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual([{ path: "closureWeeklyDay", label: "Weekly closure e-mail day", message: "must be a day of the week from 0 (Sunday) to 6 (Saturday)" }]);
    const half = await setting(engineer, { closureWeeklyDay: 3, closureWeeklyHour: null });
    expect(half.status).toBe(400);
    expect(half.body.fields).toEqual([{ path: "closureWeeklyHour", label: "Weekly closure e-mail hour", message: "must be set when a day is, and empty when the day is (both empty turn the e-mail off)" }]);
    expect((await setting(viewer, { closureWeeklyDay: null, closureWeeklyHour: null })).status).toBe(403);
    const weekday = weekdayOfDayNumber(parseIsoDate(BASE));
    expect((await setting(engineer, { closureWeeklyDay: weekday, closureWeeklyHour: 6 })).status).toBe(200);
    const read = await call(`/api/projects/${projectId}/closure-weekly`, { cookie: engineer });
    expect(read.body).toEqual({ closureWeeklyDay: weekday, closureWeeklyHour: 6, lastOn: null, note: null });
  });

  it("waits for its day and hour; a week without a closure sends nothing and says so", async () => {
    const before = plusDays(BASE, -14); // the same weekday, two weeks before the plan starts
    expect(await ours(atLocal(before, 5))).toEqual([]);
    expect(await ours(atLocal(plusDays(before, 1), 9))).toEqual([]); // not its weekday
    const [quiet] = await ours(atLocal(before, 6));
    expect(quiet).toEqual({ projectId, sent: 0, note: `On ${formatIsoDate(before)}: nothing sent — no day with closures from ${formatIsoDay(before)} to ${formatIsoDay(plusDays(before, 6))}.` });
    expect(await mailTo(subscriber)).toHaveLength(1); // the closure notice of the publication only
  });

  it("sends the week ahead of the standing publication to every subscriber, once that day", async () => {
    const [sent] = await ours(atLocal(BASE, 6));
    expect(sent.sent).toBe(1);
    expect(sent.note).toMatch(new RegExp(`^On ${formatIsoDate(BASE)}: sent to 1 subscriber — \\d days? with closures from ${formatIsoDay(BASE)} to ${formatIsoDay(plusDays(BASE, 6))}\\.$`));
    expect(await ours(atLocal(BASE, 9))).toEqual([]); // once a day
    const mail = (await mailTo(subscriber)).at(-1)!;
    expect(mail.subject).toBe(`Lane closures in the week ahead: Test structure, from ${formatIsoDay(BASE)}`);
    // Each day with closures: its closures with their local hours and lanes, then the expected backup; only days of the week.
    expect(mail.text_body).toMatch(/\n\w{3} \d{1,2} \w{3} \d{4}\n {2}\d\d:\d\d–\d\d:\d\d {2}.+ \(.+ closed(, round the clock)?\)\n/);
    const listed = [...mail.text_body.matchAll(/^\w{3} (\d{1,2} \w{3} \d{4})$/gm)].map((m) => m[1]);
    const week = Array.from({ length: 7 }, (_, i) => formatIsoDate(plusDays(BASE, i)));
    expect(listed.length).toBeGreaterThan(0);
    expect(listed.every((d) => week.includes(d))).toBe(true);
    expect(mail.text_body).toMatch(/\n {2}(Expected longest backup \d+\.\d mi.*|No significant backup expected)\.\n/);
    expect(mail.text_body).toContain("Times are local (America/Chicago) planning estimates");
    const read = await call(`/api/projects/${projectId}/closure-weekly`, { cookie: engineer });
    expect(read.body).toMatchObject({ lastOn: BASE, note: sent.note });
  });

  it("an archived project sends nothing", async () => {
    await db`UPDATE projects SET archived_at = now() WHERE id = ${projectId}`;
    try {
      expect(await ours(atLocal(plusDays(BASE, 7), 6))).toEqual([]);
    } finally {
      await db`UPDATE projects SET archived_at = NULL WHERE id = ${projectId}`;
    }
  });

  it("one project whose week cannot be claimed does not keep another's e-mail back, whichever is looked at first", async () => {
    const other = await freshTeam(db, ["engineer"]);
    const otherEngineer = await other.members[0].cookie();
    const otherSubscriber = `weekly-other-${Date.now()}@marrin-county.example`;
    await publishWeeklyPlan(other.projectId, otherEngineer, otherSubscriber);
    const weekday = weekdayOfDayNumber(parseIsoDate(BASE));
    expect((await call(`/api/projects/${other.projectId}/closure-weekly`, { method: "PUT", cookie: otherEngineer, body: { closureWeeklyDay: weekday, closureWeeklyHour: 6 } })).status).toBe(200);
    // The database refuses every change to one project (as a failing disk or a lock timeout would): its claim throws.
    const refuse = (id: string) => refuseRows(db, { name: "project", table: "projects", on: "UPDATE", when: `NEW.id = '${id}'` });
    const both = async (now: Date) => (await sendWeeklyClosureEmails(now)).filter((d) => d.projectId === projectId || d.projectId === other.projectId).map((d) => d.projectId);
    let allow: () => Promise<void> = async () => {};
    try {
      // Each of the two refused in turn (a week apart): one of the two weeks has the refused project looked at first.
      allow = await refuse(projectId);
      expect(await both(atLocal(plusDays(BASE, 14), 6))).toEqual([other.projectId]);
      allow = await refuse(other.projectId);
      expect(await both(atLocal(plusDays(BASE, 21), 6))).toEqual([projectId]);
    } finally {
      await allow();
    }
    // The refused weeks were not marked sent: the next pass sends each.
    expect(await both(atLocal(plusDays(BASE, 21), 7))).toEqual([other.projectId]);
  });

  it("sends nothing once the publication is withdrawn (its link revoked)", async () => {
    const links = await call(`/api/scenarios/${(await db`SELECT scenario_id FROM closure_publications cp JOIN scenarios s ON s.id = cp.scenario_id WHERE s.project_id = ${projectId}`)[0].scenario_id}/share-links`, { cookie: engineer });
    const feed = links.body.links.find((l: { label: string }) => l.label === "Closure calendar feed");
    expect((await call(`/api/share-links/${feed.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    const count = (await mailTo(subscriber)).length;
    expect(await ours(atLocal(plusDays(BASE, 28), 6))).toEqual([]);
    expect(await mailTo(subscriber)).toHaveLength(count);
  });
});
