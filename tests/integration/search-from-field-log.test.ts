/**
 * A plan search of the rest of a job under way: every plan starts from the field log's as-built state at the data
 * date, as a re-forecast does. The plan as saved comes out exactly as a re-forecast of it from the same data date,
 * seed and iterations (the same engine path, climate profile alone); the search keeps the field log as it stood
 * when it was started; a start date cannot vary once the work has started, and a data date after today is refused
 * by name.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { outcomeOf } from "../../sim/frontier";
import type { RunSummary } from "../../sim/index";

let db: postgres.Sql;
let engineer: string;
let scenarioId: string;
const dataDate = isoDaysFromToday(-5);
const spec = (over: Record<string, unknown> = {}) => ({
  dimensions: [{ kind: "crews", operation: "overlay", values: [1, 2] }],
  maxVariants: 4,
  iterations: 100,
  seed: "rest-of-job",
  fromFieldLog: { dataDate },
  ...over,
});
const shift = (daysAgo: number, from: number, to: number) => ({ workDate: isoDaysFromToday(-daysAgo), shift: "day", operationId: "milling", fromStationFt: from, toStationFt: to, crew: "M1" });

beforeAll(async () => {
  db = appDatabase();
  const team = await freshTeam(db, ["engineer"]);
  engineer = await team.members[0].cookie();
  scenarioId = (await createPastScenario(engineer, team.projectId, "Rest of the job")).id;
  for (const s of [shift(20, 0, 300), shift(19, 300, 600)]) expect((await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie: engineer, body: s })).status).toBe(201);
}, 60_000);
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

// Engine jobs share the worker with every file running beside this one: the waits below are bounded, not 30 s.
describe("a plan search from the field log", { timeout: 180_000 }, () => {
  it("runs the plan as saved exactly as a re-forecast from the same data date, and keeps the field log it started from", async () => {
    const started = await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie: engineer, body: { name: "Second overlay crew for the rest", spec: spec() } });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    const searchId = started.body.search.id;
    // A shift recorded after the search began is not the search's: it keeps the two it started from.
    expect((await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie: engineer, body: shift(18, 600, 800) })).status).toBe(201);
    expect((await waitForJob(started.body.job.id, engineer, { timeoutMs: 120_000 })).status).toBe("completed");
    const view = (await call(`/api/searches/${searchId}`, { cookie: engineer })).body;
    expect(view.search.spec.fromFieldLog).toEqual({ dataDate });
    expect(view.search.fieldLogShifts).toBe(2);
    const [stored] = await db`SELECT field_log FROM plan_searches WHERE id = ${searchId}`;
    expect(stored.field_log.map((r: { fromStationFt: number }) => r.fromStationFt)).toEqual([0, 300]);
    const asSaved = view.variants.find((v: { idx: number }) => v.idx === 0);
    expect(asSaved.status).toBe("done");

    // The re-forecast of the same plan from the same field log (the third shift deleted again), data date, seed and
    // iterations: its outcome is the search's plan as saved, figure for figure.
    const rows = (await call(`/api/scenarios/${scenarioId}/progress`, { cookie: engineer })).body.entries as { id: string; fromStationFt: number; version: number }[];
    const third = rows.find((r) => r.fromStationFt === 600)!;
    expect((await call(`/api/progress/${third.id}?version=${third.version}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    const re = await call(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate, seed: "rest-of-job", iterations: 100 } });
    expect(re.status).toBe(202);
    const job = await waitForJob(re.body.job.id, engineer);
    expect(job.status).toBe("completed");
    const [run] = await db`SELECT results FROM simulation_runs WHERE id = ${job.runId}`;
    expect(asSaved.outcome).toEqual(JSON.parse(JSON.stringify(outcomeOf(run.results as RunSummary))));
    // And the second overlay crew was searched from the same state: a plan of its own, done.
    expect(view.variants.filter((v: { status: string }) => v.status === "done").length).toBe(3);
  });

  it("makes a variant the plan itself: a new version of the scenario that keeps its field log, and only over the version searched", async () => {
    const started = await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie: engineer, body: { name: "Crews for the rest", spec: spec() } });
    expect(started.status).toBe(202);
    const searchId = started.body.search.id;
    const before = (await call(`/api/scenarios/${scenarioId}`, { cookie: engineer })).body.scenario;
    const shifts = (await call(`/api/scenarios/${scenarioId}/progress`, { cookie: engineer })).body.entries.length;
    const variants = (await call(`/api/searches/${searchId}`, { cookie: engineer })).body.variants as { idx: number; label: string; changesPlan: boolean }[];
    const twoCrews = variants.find((v) => v.label === "overlay: 2 crews")!;
    // The page offers only variants that change the plan: one crew is what it has.
    expect(Object.fromEntries(variants.map((v) => [v.label, v.changesPlan]))).toEqual({ "The plan as saved": false, "overlay: 1 crew": false, "overlay: 2 crews": true });
    expect((await call(`/api/searches/${searchId}/adopt`, { method: "POST", cookie: engineer, body: { idx: 0 } })).body.fields[0]).toMatchObject({ path: "idx", message: "must be a variant of the search" });
    // One crew is what the plan has: that variant changes nothing, so no version is made for it.
    const oneCrew = variants.find((v) => v.label === "overlay: 1 crew")!;
    const same = await call(`/api/searches/${searchId}/adopt`, { method: "POST", cookie: engineer, body: { idx: oneCrew.idx } });
    expect(same.status).toBe(400);
    expect(same.body.fields[0]).toMatchObject({ path: "idx", message: "is the plan as it stands: nothing to change" });

    const adopted = await call(`/api/searches/${searchId}/adopt`, { method: "POST", cookie: engineer, body: { idx: twoCrews.idx } });
    expect(adopted.status, JSON.stringify(adopted.body)).toBe(200);
    expect(adopted.body).toEqual({ scenarioId, version: before.version + 1 });
    const after = (await call(`/api/scenarios/${scenarioId}`, { cookie: engineer })).body;
    expect(after.scenario.definition.operations.find((o: { id: string }) => o.id === "overlay").crews).toBe(2);
    expect(after.scenario.name).toBe(before.name);
    expect(after.revisions[0].changeNote).toBe(`Variant ${twoCrews.idx} of the plan search “Crews for the rest”: overlay: 2 crews`);
    // The field log stays with the scenario: the next re-forecast starts from it with the new crews.
    expect((await call(`/api/scenarios/${scenarioId}/progress`, { cookie: engineer })).body.entries.length).toBe(shifts);
    // The search varied the version before: a second variant would overwrite the first, so it is refused.
    const again = await call(`/api/searches/${searchId}/adopt`, { method: "POST", cookie: engineer, body: { idx: twoCrews.idx } });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/^The plan was saved again after this search \(it varied version \d+; the plan is at version \d+ now\)\. Nothing was changed/);
    expect((await call(`/api/scenarios/${scenarioId}`, { cookie: engineer })).body.scenario.version).toBe(before.version + 1);
    expect((await waitForJob(started.body.job.id, engineer, { timeoutMs: 120_000 })).status).toBe("completed");
  });

  it("refuses a start date to vary, and a data date after today, naming each field", async () => {
    const withStart = await call(`/api/scenarios/${scenarioId}/searches`, {
      method: "POST",
      cookie: engineer,
      body: { name: "Start later", spec: spec({ dimensions: [{ kind: "startDate", values: [isoDaysFromToday(-21), isoDaysFromToday(-14)] }] }) },
    });
    expect(withStart.status).toBe(400);
    expect(withStart.body.fields).toEqual([expect.objectContaining({ path: "spec.dimensions[0]", message: "start dates cannot vary in a search from the field log: the work has started" })]);
    const future = await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie: engineer, body: { name: "Tomorrow", spec: spec({ fromFieldLog: { dataDate: isoDaysFromToday(2) } }) } });
    expect(future.status).toBe(400);
    expect(future.body.fields).toEqual([expect.objectContaining({ path: "spec.fromFieldLog.dataDate", label: "Search › From the field log › Data date", message: expect.stringMatching(/^Data date must not be in the future/) })]);
    const notADate = await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie: engineer, body: { name: "Bad", spec: spec({ fromFieldLog: { dataDate: "soon" } }) } });
    expect(notADate.status).toBe(400);
    expect(notADate.body.fields[0].path).toBe("spec.fromFieldLog.dataDate");
  });
});
