/**
 * "N changes in the field log are not in this forecast" is one rule (db/queries/progress.ts `shiftsNotInRun`) read by
 * every query that shows a forecast: the Field log's, the Outlook's and the brief's, the project list's and the
 * daily re-forecast's. Each must count this scenario's changes after its newest re-forecast and nothing else — not a
 * shift of another scenario, not a correction made before it was run (the rule was once written with bare column
 * names, which in a query of simulation_runs alone named the field-log entry's own columns).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { getLatestReforecast, getNewestReforecastHeadline } from "@db/queries/progress";
import { getPlanOfRecord } from "@db/queries/projects";
import { getNewestReforecastBasis } from "@db/queries/daily-reforecast";

let db: postgres.Sql;
let cookie: string;
let projectId: string;
let planId: string;
let otherId: string;

const shift = (fromStationFt: number, toStationFt: number, daysAgo: number) => ({ workDate: isoDaysFromToday(-daysAgo), shift: "day", operationId: "milling", fromStationFt, toStationFt, crew: "M1" });
const record = async (scenarioId: string, body: unknown) => {
  const res = await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie, body });
  expect(res.status).toBe(201);
  return res.body.id as string;
};

/** The count as each reader of the plan's newest re-forecast sees it. */
async function counts() {
  const [fieldLog, outlook, basis, plan] = await Promise.all([
    getLatestReforecast({ scenarioId: planId }),
    getNewestReforecastHeadline({ scenarioId: planId }),
    getNewestReforecastBasis({ scenarioId: planId }),
    getPlanOfRecord({ projectId }),
  ]);
  return { fieldLog: fieldLog?.shiftsNotIn, outlook: outlook?.shiftsNotIn, daily: basis?.changes, projectList: plan?.planRunShiftsNotIn };
}

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["engineer"]);
  projectId = team.projectId;
  cookie = await team.members[0].cookie();
  planId = (await createPastScenario(cookie, projectId, "Counted plan")).id;
  otherId = (await createPastScenario(cookie, projectId, "Another plan")).id;
  expect((await call(`/api/projects/${projectId}/plan-of-record`, { method: "PUT", cookie, body: { planScenarioId: planId } })).status).toBe(200);
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

describe("field-log changes a forecast does not know", () => {
  it("are this scenario's changes after its newest re-forecast, the same for every reader", async () => {
    // A shift recorded and corrected, then re-forecast: the forecast knows both.
    const id = await record(planId, shift(0, 200, 6));
    expect((await call(`/api/progress/${id}`, { method: "PUT", cookie, body: { ...shift(0, 250, 6), version: 1 } })).status).toBe(200);
    const re = await call(`/api/scenarios/${planId}/reforecast`, { method: "POST", cookie, body: { dataDate: isoDaysFromToday(-1), seed: "count", iterations: 20 } });
    expect(re.status).toBe(202);
    expect((await waitForJob(re.body.job.id, cookie)).status).toBe("completed");
    // Another scenario's field log is not this forecast's business.
    await record(otherId, shift(0, 300, 5));
    expect(await counts()).toEqual({ fieldLog: 0, outlook: 0, daily: 0, projectList: 0 });
    // A shift of this plan recorded since is one change, for every reader.
    await record(planId, shift(250, 400, 4));
    expect(await counts()).toEqual({ fieldLog: 1, outlook: 1, daily: 1, projectList: 1 });
  });
});
