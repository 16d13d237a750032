/**
 * Forecast e-mails: a member ticks "E-mail me each new forecast of the plan of record"; each new forecast of the
 * plan of record (a plan run, or once it has one a re-forecast from the field log — db/queries/runs.ts `forecastOrder`) is then e-mailed to those who asked — once, in the project list's words — and
 * to nobody else, with how far the field log says the job has got once it has shifts; choosing another plan of record sends its newest forecast, said as the new plan; an archived
 * project sends nothing until it is restored. The
 * app's own sender (every 2 s under `npm test`) does the sending; the tests wait for its outbox rows.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { formatIsoDate } from "@/lib/format";
import { sendForecastAlerts } from "@/lib/server/forecast-alerts";

let db: postgres.Sql;
let projectId: string;
let admin: { email: string; cookie: string };
let engineer: { email: string; cookie: string };
let viewer: { email: string; cookie: string };
let planId: string;

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["admin", "engineer", "viewer"]);
  projectId = team.projectId;
  const [a, e, v] = await Promise.all(team.members.map(async (m) => ({ email: m.email, cookie: await m.cookie() })));
  [admin, engineer, viewer] = [a, e, v];
  planId = (await createPastScenario(admin.cookie, projectId, "Forecast e-mails plan")).id;
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

const alerts = (cookie: string, body: unknown) => call(`/api/projects/${projectId}/forecast-alerts`, { method: "PUT", cookie, body });
const choosePlan = (scenarioId: string) => call(`/api/projects/${projectId}/plan-of-record`, { method: "PUT", cookie: admin.cookie, body: { planScenarioId: scenarioId } });
const mailTo = async (email: string) => db`SELECT subject, text_body FROM email_outbox WHERE to_address = ${email} ORDER BY created_at, id`;
const announced = async () => (await db`SELECT plan_announced_run_id AS id FROM projects WHERE id = ${projectId}`)[0].id as string | null;

async function run(scenarioId: string, seed: string): Promise<{ runId: string; p80: string }> {
  const queued = await call(`/api/scenarios/${scenarioId}/runs`, { method: "POST", cookie: engineer.cookie, body: { seed, iterations: 20 } });
  expect(queued.status).toBe(202);
  const job = await waitForJob(queued.body.job.id, engineer.cookie);
  expect(job.status).toBe("completed");
  const [row] = await db`SELECT summary FROM simulation_runs WHERE id = ${job.runId}`;
  return { runId: job.runId!, p80: row.summary.finish.p80 };
}

/** A re-forecast of the plan from the field log as of yesterday, run by the server; its run id. */
async function reforecast(seed: string): Promise<string> {
  const queued = await call(`/api/scenarios/${planId}/reforecast`, { method: "POST", cookie: engineer.cookie, body: { dataDate: isoDaysFromToday(-1), seed, iterations: 20 } });
  expect(queued.status).toBe(202);
  const job = await waitForJob(queued.body.job.id, engineer.cookie);
  expect(job.status).toBe("completed");
  return job.runId!;
}

/** Waits (bounded) until the app's sender has announced `runId`. */
async function announcedAs(runId: string) {
  const deadline = Date.now() + 20_000;
  while ((await announced()) !== runId) {
    if (Date.now() > deadline) throw new Error(`run ${runId} was not announced within 20 s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe("forecast e-mails", () => {
  it("are each member's own choice, for every role, with a clear answer to a bad body", async () => {
    expect((await alerts(viewer.cookie, { forecastAlerts: true })).status).toBe(200);
    const bad = await alerts(engineer.cookie, { forecastAlerts: "yes" });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual([{ path: "forecastAlerts", label: "Forecast e-mails", message: "must be true (send them) or false (stop them)" }]);
    const rows = await db`SELECT u.email, m.forecast_alerts FROM project_members m JOIN users u ON u.id = m.user_id WHERE m.project_id = ${projectId} ORDER BY u.email`;
    expect(Object.fromEntries(rows.map((r) => [r.email, r.forecast_alerts]))).toEqual({ [admin.email]: false, [engineer.email]: false, [viewer.email]: true });
  });

  it("choosing a plan of record e-mails its newest forecast as the new plan; each one after is e-mailed once, to those who asked", async () => {
    const before = await run(planId, "before-chosen");
    expect((await choosePlan(planId)).status).toBe(200);
    await announcedAs(before.runId);
    const first = await run(planId, "first");
    await announcedAs(first.runId);
    // A shift in the plan's field log: the next e-mail says how far the job has got, as the project list does.
    const shift = { workDate: isoDaysFromToday(-20), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 300, crew: "M1" };
    expect((await call(`/api/scenarios/${planId}/progress`, { method: "POST", cookie: engineer.cookie, body: shift })).status).toBe(201);
    const second = await run(planId, "second");
    await announcedAs(second.runId);

    const mail = await mailTo(viewer.email);
    expect(mail.map((m) => m.subject)).toEqual([before.p80, first.p80, second.p80].map((p80) => expect.stringMatching(new RegExp(`^Forecast for Hardening test \\w+: P80 finish ${formatIsoDate(p80)}$`))));
    expect(mail[0].text_body).toMatch(/^"Hardening test \w+" is now run by another plan of record, "Forecast e-mails plan"\. Its forecast:/);
    expect(mail[1].text_body).toMatch(/^A new forecast of the plan of record of "Hardening test \w+":/);
    expect(mail[1].text_body).toContain(`Forecast e-mails plan: P80 finish ${formatIsoDate(first.p80)} (P50 `);
    expect(mail[1].text_body).toContain(`/scenarios/${planId}`);
    expect(mail[1].text_body).toContain(`Turn them off on the project page: `);
    // The third says how far the P80 moved since the second.
    expect(mail[2].text_body).toMatch(/\), (\d+ days? (later|earlier) than|unchanged since) the previous forecast/);
    expect(mail[1].text_body).not.toContain("Progress:");
    expect(mail[2].text_body).toContain(`Progress: under way, nothing finished yet (Mechanical milling furthest ahead, 30 % done); last shift in the field log ${formatIsoDate(shift.workDate)}.`);
    // And how the job stands against the plan run it was forecast from (its median iteration), on the line after.
    expect(mail[2].text_body).toMatch(/\n\nAgainst the plan at \d{1,2} \w{3} \d{4}: (every operation on plan or ahead of it|\d of 2 operations behind[,;] .+)\.\n\n/);
    expect(await mailTo(engineer.email)).toHaveLength(0);
    expect(await mailTo(admin.email)).toHaveLength(0);
  });

  it("once the plan's closures are published, a newer forecast's e-mail and the project page say the public sees an earlier one", async () => {
    const published = await call(`/api/scenarios/${planId}/closure-publications`, { method: "POST", cookie: engineer.cookie });
    expect(published.status).toBe(201);
    const pageSays = async () => {
      const page = await call(`/projects/${projectId}`, { cookie: viewer.cookie });
      expect(page.status).toBe(200);
      return String(page.body).includes('data-testid="plan-publication-lag"');
    };
    expect(await pageSays()).toBe(false); // published from the newest forecast: nothing lags
    // A plan edit that moves no work (its description) run with the published run's seed: a newer forecast with the
    // same closures — the public's notice holds.
    const current = (await call(`/api/scenarios/${planId}`, { cookie: engineer.cookie })).body.scenario;
    const edited = { name: current.name, definition: { ...current.definition, description: "Closures checked with the county." }, version: current.version };
    expect((await call(`/api/scenarios/${planId}`, { method: "PUT", cookie: engineer.cookie, body: edited })).status).toBe(200);
    const [pub] = await db`SELECT r.id, r.seed FROM closure_publications p JOIN simulation_runs r ON r.id = p.run_id WHERE p.scenario_id = ${planId}`;
    const same = await run(planId, pub.seed);
    expect(same.runId).not.toBe(pub.id);
    await announcedAs(same.runId);
    expect((await mailTo(viewer.email)).at(-1)!.text_body).not.toContain("the public sees");
    expect(await pageSays()).toBe(false);
    // A re-forecast from yesterday: every operation but the recorded milling starts over from today, so its
    // closures from today on are not the published plan run's.
    await announcedAs(await reforecast("third"));
    const mail = (await mailTo(viewer.email)).at(-1)!;
    expect(mail.text_body).toMatch(
      /\n\nThe lane closures the public sees \(published \d{1,2} \w{3} \d{4}, \d\d:\d\d\) come from an earlier forecast, until someone publishes again from the plan's Share tab\. .*from today on.*; the first difference is on \w{3} \d{1,2} \w{3} \d{4}\.\n\n/,
    );
    expect(await pageSays()).toBe(true);
    // The e-mails before the publication said nothing of it.
    expect((await mailTo(viewer.email)).slice(0, -1).some((m) => m.text_body.includes("the public sees"))).toBe(false);
  });

  it("a plan run after a re-forecast is not the forecast: no e-mail, and the project list and the published closures keep the re-forecast", async () => {
    const standing = await announced();
    const [kind] = await db`SELECT data_date FROM simulation_runs WHERE id = ${standing}`;
    expect(kind.data_date).not.toBeNull(); // the re-forecast of the test before
    const sent = (await mailTo(viewer.email)).length;
    // Run the plan again: a plan run from the plan's start, knowing nothing of the shift in the field log.
    const planRun = await run(planId, "plan-again");
    await sendForecastAlerts();
    expect(await announced()).toBe(standing);
    expect(await mailTo(viewer.email)).toHaveLength(sent);
    const listed = (await call("/api/projects", { cookie: viewer.cookie })).body.projects.find((p: { id: string }) => p.id === projectId);
    expect(listed.planRunId).toBe(standing);
    expect(listed.planRunDataDate).toBe(isoDaysFromToday(-1));
    // Published now, the public's closures come from the re-forecast too, not from the newer plan run.
    expect((await call(`/api/scenarios/${planId}/closure-publications`, { method: "POST", cookie: engineer.cookie })).status).toBe(201);
    const [pub] = await db`SELECT run_id FROM closure_publications WHERE scenario_id = ${planId} ORDER BY published_at DESC, id DESC LIMIT 1`;
    expect(pub.run_id).toBe(standing);
    expect(pub.run_id).not.toBe(planRun.runId);
  });

  it("stop when turned off, and go with the plan of record: another scenario's runs are not its forecasts", async () => {
    const other = (await createPastScenario(admin.cookie, projectId, "Not the plan")).id;
    const sent = (await mailTo(viewer.email)).length;
    const before = await announced();
    await run(other, "other");
    await sendForecastAlerts();
    expect(await announced()).toBe(before);
    expect((await alerts(viewer.cookie, { forecastAlerts: false })).status).toBe(200);
    // The plan's next forecast: a re-forecast (a plan run no longer is one once the plan has re-forecasts).
    await announcedAs(await reforecast("fourth"));
    expect(await mailTo(viewer.email)).toHaveLength(sent);
    expect((await alerts(viewer.cookie, { forecastAlerts: true })).status).toBe(200);
  });

  it("an archived project sends nothing; restored, its newest forecast is e-mailed", async () => {
    const sent = (await mailTo(viewer.email)).length;
    const before = await announced();
    expect((await call(`/api/projects/${projectId}/archive`, { method: "PUT", cookie: admin.cookie, body: { archived: true } })).status).toBe(200);
    // A run that finished after the archive (queued before it): a copy of the newest, made now.
    const [late] = await db`
      INSERT INTO simulation_runs
      SELECT (jsonb_populate_record(NULL::simulation_runs, to_jsonb(r) || jsonb_build_object('id', gen_random_uuid(), 'created_at', now(), 'result_key', NULL))).*
      FROM simulation_runs r WHERE r.id = ${before}
      RETURNING id`;
    await sendForecastAlerts();
    expect(await announced()).toBe(before);
    expect(await mailTo(viewer.email)).toHaveLength(sent);
    // Archived, the box is still there to turn e-mail off.
    expect((await alerts(viewer.cookie, { forecastAlerts: true })).status).toBe(200);

    expect((await call(`/api/projects/${projectId}/archive`, { method: "PUT", cookie: admin.cookie, body: { archived: false } })).status).toBe(200);
    await announcedAs(late.id);
    expect(await mailTo(viewer.email)).toHaveLength(sent + 1);
  });
});
