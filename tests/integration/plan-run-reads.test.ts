/**
 * The project list, the project page and the forecast e-mails measure each plan of record against its plan run with
 * one query for all plans (`listLatestPlanRunsWithTrace`): for every scenario it must pick exactly the run the
 * one-scenario read picks (`getLatestPlanRunWithTrace`) — the newest forecast without a data date, never a
 * re-forecast from the field log — and nothing for a scenario never run.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { serverRunDone } from "../helpers/jobs";
import { appDatabase, freshScenario } from "../helpers/fresh-team";
import { getLatestPlanRunWithTrace, listLatestPlanRunsWithTrace } from "@db/queries/progress";

let db: postgres.Sql;
let scheduler: string;
let projectId: string;

beforeAll(async () => {
  db = appDatabase();
  scheduler = await signInAs("scheduler");
  projectId = (await kestrelProject(scheduler)).id;
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

describe("the newest plan run of many scenarios, read at once", () => {
  it("is, scenario by scenario, the one-scenario read's run: the newest of two plan runs, no re-forecast, none before a run", async () => {
    const base = await demoDefinition(scheduler, projectId);
    const twice = await freshScenario(scheduler, projectId, base, "Plan run read twice");
    for (const seed of ["older", "newer"]) expect((await serverRunDone(twice.id, scheduler, { seed, iterations: 20 })).status).toBe("completed");
    const never = await freshScenario(scheduler, projectId, base, "Plan run never run");
    const listed = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
    const ids: string[] = listed.body.scenarios.map((s: { id: string }) => s.id);
    expect(ids).toEqual(expect.arrayContaining([twice.id, never.id]));

    const batch = await listLatestPlanRunsWithTrace({ scenarioIds: ids });
    for (const id of ids) expect({ id, run: batch.get(id) ?? null }).toEqual({ id, run: await getLatestPlanRunWithTrace({ scenarioId: id }) });
    expect(batch.get(twice.id)!.seed).toBe("newer");
    expect(batch.has(never.id)).toBe(false);
    // A scenario whose newest run is a re-forecast newer than its plan run (the seeded main demo is one): the plan run
    // is read, with its median iteration.
    const [main] = await db`
      SELECT s.id FROM scenarios s
      WHERE s.id IN ${db(ids)}
        AND (SELECT r.data_date FROM simulation_runs r WHERE r.scenario_id = s.id ORDER BY r.created_at DESC, r.id DESC LIMIT 1) IS NOT NULL
        AND EXISTS (SELECT 1 FROM simulation_runs r WHERE r.scenario_id = s.id AND r.data_date IS NULL AND r.verification IN ('server', 'verified'))
      LIMIT 1`;
    expect(main).toBeDefined();
    const mainRun = batch.get(main.id)!;
    const [{ newest }] = await db`SELECT id AS newest FROM simulation_runs WHERE scenario_id = ${main.id} ORDER BY created_at DESC, id DESC LIMIT 1`;
    expect(newest).not.toBe(mainRun.id); // the newest run of the scenario is a re-forecast, not what is read
    expect((mainRun.trace as { packets: unknown[] }).packets.length).toBeGreaterThan(0);
  });
});
