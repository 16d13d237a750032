/**
 * The daily re-forecast of the plan of record: an administrator or engineer turns it on at a local hour; once a
 * local day after that hour the server re-forecasts the plan from the field log as of the day before — when the
 * newest re-forecast does not know every shift, the plan changed, or a week has passed — queued as the person who
 * set it up, with the newest re-forecast's seed and iterations, and says in words what it decided.
 *
 * The pass is called here with chosen clocks, days ahead of the real one: the project's "last looked at" day is set
 * ahead first, so the app's own pass (which runs on the real clock) never takes this project's days from the test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { atLocal, createPastScenario, isoDaysFromToday, plusDays } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { runDailyReforecasts } from "@/lib/server/daily-reforecast";
import { listReforecastRuns } from "@db/queries/progress";
import { runMadeText } from "@/lib/plan-of-record-text";

const TZ = "America/Chicago"; // the fixture plan's time zone
let db: postgres.Sql;
let projectId: string;
let engineer: { id: string; cookie: string };
let planId: string;

const setting = (cookie: string, body: unknown) => call(`/api/projects/${projectId}/daily-reforecast`, { method: "PUT", cookie, body });
const ours = async (now: Date) => (await runDailyReforecasts(now)).filter((d) => d.projectId === projectId);
const reforecasts = async () => db`SELECT data_date::text AS data_date, seed, iterations, created_by FROM simulation_runs WHERE scenario_id = ${planId} AND data_date IS NOT NULL ORDER BY created_at`;

// The test's days: from a base a month ahead of the real clock (see the header).
const BASE = isoDaysFromToday(30, TZ);

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["admin", "engineer", "viewer"]);
  projectId = team.projectId;
  const e = team.members[1];
  engineer = { id: e.id, cookie: await e.cookie() };
  planId = (await createPastScenario(engineer.cookie, projectId, "Daily re-forecast plan")).id;
  expect((await call(`/api/projects/${projectId}/plan-of-record`, { method: "PUT", cookie: engineer.cookie, body: { planScenarioId: planId } })).status).toBe(200);
  // A re-forecast by hand first: the daily one follows its seed and iterations (20: quick on the worker).
  const first = await call(`/api/scenarios/${planId}/reforecast`, { method: "POST", cookie: engineer.cookie, body: { dataDate: isoDaysFromToday(-1, TZ), seed: "by-hand", iterations: 20 } });
  expect(first.status).toBe(202);
  expect((await waitForJob(first.body.job.id, engineer.cookie)).status).toBe("completed");
  await db`UPDATE projects SET daily_reforecast_last_on = ${BASE} WHERE id = ${projectId}`;
}, 120_000);

afterAll(async () => {
  await db?.end({ timeout: 5 });
  const { queue } = await import("@/lib/server/jobs");
  await (await queue()).stop({ graceful: false, wait: false }).catch(() => {});
});

describe("daily re-forecast", () => {
  it("is set by the hour, or turned off; a bad hour is refused naming the field", async () => {
    const bad = await setting(engineer.cookie, { dailyReforecastHour: 24 });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual([{ path: "dailyReforecastHour", label: "Daily re-forecast hour", message: "must be a whole hour from 0 to 23" }]);
    expect((await setting(engineer.cookie, { dailyReforecastHour: "six" })).body.fields[0].message).toBe("must be a whole hour from 0 to 23, or empty to turn it off");
    expect((await setting(engineer.cookie, { dailyReforecastHour: null })).status).toBe(200);
    const [off] = await db`SELECT daily_reforecast_hour FROM projects WHERE id = ${projectId}`;
    expect(off.daily_reforecast_hour).toBeNull();
    expect(await ours(atLocal(plusDays(BASE, 1), 7))).toEqual([]); // off: not looked at
    expect((await setting(engineer.cookie, { dailyReforecastHour: 6 })).status).toBe(200);
    const [on] = await db`SELECT daily_reforecast_hour, daily_reforecast_by FROM projects WHERE id = ${projectId}`;
    expect(on).toEqual({ daily_reforecast_hour: 6, daily_reforecast_by: engineer.id });
  });

  it("waits for the hour, then re-forecasts once that day from the day before, as its owner would, with the newest seed and iterations", async () => {
    const day = plusDays(BASE, 1);
    expect(await ours(atLocal(day, 5))).toEqual([]); // before 06:00
    const [decided] = await ours(atLocal(day, 6));
    expect(decided.note).toMatch(/^On .*: re-forecast from the field log as of .* \(the newest re-forecast is as of .*, a week or more ago\)\.$/);
    expect(await ours(atLocal(day, 9))).toEqual([]); // once a day
    expect((await waitForJob(decided.jobId!, engineer.cookie)).status).toBe("completed");
    const runs = await reforecasts();
    expect(runs.at(-1)).toEqual({ data_date: plusDays(day, -1), seed: "by-hand", iterations: 20, created_by: engineer.id });
    const [row] = await db`SELECT daily_reforecast_note FROM projects WHERE id = ${projectId}`;
    expect(row.daily_reforecast_note).toBe(decided.note);
    // On record as the daily re-forecast's, in the engineer's name; the one by hand stays the engineer's own.
    const drift = await listReforecastRuns({ scenarioId: planId });
    expect(drift.map((r) => [r.seed, r.createdByName !== null, r.automatic])).toEqual([
      ["by-hand", true, false],
      ["by-hand", true, true],
    ]);
    expect(runMadeText({ at: drift[1].createdAt, byName: drift[1].createdByName, automatic: drift[1].automatic })).toMatch(/^run .+ by the daily re-forecast, in .+'s name$/);
  });

  it("is not needed the next day when the field log has not changed; a shift recorded since makes it due", async () => {
    const day2 = plusDays(BASE, 2);
    const [quiet] = await ours(atLocal(day2, 7));
    expect(quiet.note).toMatch(/: no re-forecast needed — the newest re-forecast knows every shift in the field log\.$/);
    expect(quiet.jobId).toBeUndefined();
    const shift = { workDate: isoDaysFromToday(-5, TZ), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 200, crew: "M1" };
    expect((await call(`/api/scenarios/${planId}/progress`, { method: "POST", cookie: engineer.cookie, body: shift })).status).toBe(201);
    const [due] = await ours(atLocal(plusDays(BASE, 3), 6));
    expect(due.note).toMatch(/\(1 field-log change is not in the newest re-forecast\)\.$/);
    expect((await waitForJob(due.jobId!, engineer.cookie)).status).toBe("completed");
    expect((await reforecasts()).at(-1)!.data_date).toBe(plusDays(BASE, 2));
  });

  it("takes the newest re-forecast's iterations only as far as the server's work budget allows once the plan has grown", async () => {
    // 2,000 iterations of the 1,000 ft deck in 100 ft packets fit; after the deck grows to 20,000 ft in 10 ft packets
    // (2,000 packets × 2 operations), 1,324 do (sim/budget.ts: 40,000,000 / (2,000 × 2 × 7 + 2,192)).
    const big = await call(`/api/scenarios/${planId}/reforecast`, { method: "POST", cookie: engineer.cookie, body: { dataDate: isoDaysFromToday(-1, TZ), seed: "by-hand", iterations: 2_000 } });
    expect(big.status).toBe(202);
    expect((await waitForJob(big.body.job.id, engineer.cookie)).status).toBe("completed");
    const current = (await call(`/api/scenarios/${planId}`, { cookie: engineer.cookie })).body.scenario;
    const grown = { ...current.definition, deck: { ...current.definition.deck, lengthFt: 20_000, packetFt: 10 } };
    expect((await call(`/api/scenarios/${planId}`, { method: "PUT", cookie: engineer.cookie, body: { name: current.name, definition: grown, version: current.version } })).status).toBe(200);
    const [due] = await ours(atLocal(plusDays(BASE, 10), 6));
    expect(due.note).toMatch(/\(the plan changed since the newest re-forecast\)\.$/);
    const [job] = await db`SELECT iterations FROM engine_jobs WHERE id = ${due.jobId!}`;
    expect(job.iterations).toBe(1_324);
    // Not waited for: a large run, and only its size is the point here.
    expect((await call(`/api/jobs/${due.jobId}`, { method: "DELETE", cookie: engineer.cookie })).status).toBe(200);
  });

  it("stops, saying so, when the person who set it up may no longer run plans; an archived project is not looked at", async () => {
    await db`UPDATE project_members SET role = 'viewer' WHERE project_id = ${projectId} AND user_id = ${engineer.id}`;
    const before = (await reforecasts()).length;
    const [refused] = await ours(atLocal(plusDays(BASE, 20), 6));
    expect(refused.note).toMatch(/: no re-forecast — the person who set it up may no longer run this project's plans; set it up again\.$/);
    await db`UPDATE project_members SET role = 'engineer' WHERE project_id = ${projectId} AND user_id = ${engineer.id}`;
    await db`UPDATE projects SET archived_at = now() WHERE id = ${projectId}`;
    expect(await ours(atLocal(plusDays(BASE, 21), 6))).toEqual([]);
    await db`UPDATE projects SET archived_at = NULL WHERE id = ${projectId}`;
    expect((await reforecasts()).length).toBe(before);
  });
});
