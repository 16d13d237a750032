/**
 * Field progress over HTTP: validation messages with field paths, versioned edits (409 on a stale version),
 * history of who changed what, roles, deletes that would leave later work ahead, and re-forecasts stored with
 * their data date that never schedule recorded work again.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import Papa from "papaparse";
import { call, kestrelProject, signInAs } from "../helpers/app";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { waitForJob } from "../helpers/jobs";
import { getForecastStandingOn } from "@db/queries/progress";

let scheduler: string;
let inspector: string;
let engineer: string;
let viewer: string;
let projectId: string;

const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
afterAll(() => appDb.end());

beforeAll(async () => {
  [scheduler, inspector, engineer, viewer] = await Promise.all([signInAs("scheduler"), signInAs("inspector"), signInAs("engineer"), signInAs("viewer")]);
  projectId = (await kestrelProject(scheduler)).id;
});

const day = (n: number) => isoDaysFromToday(-21 + n); // day n of the fixture plan
const milling = (over: Record<string, unknown> = {}) => ({ workDate: day(1), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 300, crew: "M1", tempF: 55, ...over });

async function post(id: string, body: unknown, cookie = inspector) {
  return call(`/api/scenarios/${id}/progress`, { method: "POST", cookie, body });
}

describe("progress entries", () => {
  it("records a shift, lists it, and answers rule violations with field paths and named fields", async () => {
    const s = await createPastScenario(scheduler, projectId, "Progress rules");
    const ok = await post(s.id, milling());
    expect(ok.status).toBe(201);
    const list = await call(`/api/scenarios/${s.id}/progress`, { cookie: viewer });
    expect(list.status).toBe(200);
    expect(list.body.entries).toHaveLength(1);
    expect(list.body.entries[0]).toMatchObject({ operationId: "milling", fromStationFt: 0, toStationFt: 300, enteredByName: "Rosa Tenney" });

    const again = await post(s.id, milling({ workDate: day(2), fromStationFt: "2+00", toStationFt: "4+00" }));
    expect(again.status).toBe(400);
    expect(again.body.fields).toEqual([{ path: "fromStationFt", label: "From station", message: expect.stringMatching(/^Mechanical milling is already recorded over STA 0\+00–STA 3\+00/) }]);
    const letters = await post(s.id, milling({ workDate: day(2), fromStationFt: "3a0", toStationFt: 400 }));
    expect(letters.status).toBe(400);
    expect(letters.body.fields[0]).toMatchObject({ path: "fromStationFt", message: expect.stringContaining("“3a0” is neither") });

    const outside = await post(s.id, milling({ fromStationFt: 900, toStationFt: 1100 }));
    expect(outside.status).toBe(400);
    expect(outside.body.fields).toEqual([{ path: "toStationFt", label: "To station", message: "To station must be inside the deck (STA 0+00 to STA 10+00)" }]);

    const future = await post(s.id, milling({ workDate: isoDaysFromToday(1) }));
    expect(future.status).toBe(400);
    expect(future.body.fields[0].path).toBe("workDate");
    expect(future.body.fields[0].message).toMatch(/^Work date must not be in the future/);

    const ahead = await post(s.id, { ...milling({ operationId: "overlay", fromStationFt: 200, toStationFt: 400 }) });
    expect(ahead.status).toBe(400);
    expect(ahead.body.fields).toEqual([{ path: "toStationFt", label: "To station", message: "Overlay placement cannot be recorded ahead of Mechanical milling: Mechanical milling has no progress recorded by this shift at STA 3+00" }]);

    const schema = await post(s.id, milling({ lostHours: 25, discovered: [{ kind: "bottom-mat", fromStationFt: 100, toStationFt: 90, areaSqFt: 0 }] }));
    expect(schema.status).toBe(400);
    expect(schema.body.fields.map((f: { path: string }) => f.path).sort()).toEqual(["discovered[0].areaSqFt", "discovered[0].toStationFt", "lostHours", "lostReason"]);
    expect(schema.body.fields.find((f: { path: string }) => f.path === "lostHours").message).toBe("Lost hours must be between 0 and 24");

    const outsideItem = await post(s.id, milling({ fromStationFt: 300, toStationFt: 400, discovered: [{ kind: "full-depth", fromStationFt: 390, toStationFt: 420, areaSqFt: 12 }] }));
    expect(outsideItem.status).toBe(400);
    expect(outsideItem.body.fields).toEqual([{ path: "discovered[0].toStationFt", label: "Discovered condition 1 › To station", message: "Condition to station must be inside this shift's range (STA 3+00 to STA 4+00)" }]);
    expect((await call(`/api/scenarios/${s.id}/progress`, { cookie: viewer })).body.entries).toHaveLength(1);
  });

  it("edits need the loaded version (409 otherwise) and keep a history of who changed what", async () => {
    const s = await createPastScenario(scheduler, projectId, "Progress edits");
    const created = await post(s.id, milling());
    const id = created.body.id;
    const put = await call(`/api/progress/${id}`, { method: "PUT", cookie: engineer, body: { ...milling({ toStationFt: 350, crew: "M2" }), version: 1 } });
    expect(put.status).toBe(200);
    expect(put.body.version).toBe(2);
    const stale = await call(`/api/progress/${id}`, { method: "PUT", cookie: inspector, body: { ...milling({ toStationFt: 500 }), version: 1 } });
    expect(stale.status).toBe(409);
    expect(stale.body.current.toStationFt).toBe(350);
    const got = await call(`/api/progress/${id}`, { cookie: viewer });
    expect(got.body.entry).toMatchObject({ toStationFt: 350, crew: "M2", version: 2 });
    expect(got.body.history).toHaveLength(2);
    expect(got.body.history[0]).toMatchObject({ changedByName: "Dana Whitcomb", before: { toStationFt: 300, crew: "M1" }, after: { toStationFt: 350, crew: "M2" } });
    expect(got.body.history[1]).toMatchObject({ changedByName: "Rosa Tenney", before: null, after: { toStationFt: 300 } });

    // A delete of the version someone saw: refused once it was corrected (nothing deleted), and a version that is
    // not a number is named.
    const staleDelete = await call(`/api/progress/${id}?version=1`, { method: "DELETE", cookie: inspector });
    expect(staleDelete.status).toBe(409);
    expect(staleDelete.body.error).toBe("Someone else changed this entry (version 2) after you opened version 1. Nothing was deleted.");
    expect(staleDelete.body.current.crew).toBe("M2");
    const badVersion = await call(`/api/progress/${id}?version=two`, { method: "DELETE", cookie: inspector });
    expect(badVersion.status).toBe(400);
    expect(badVersion.body.fields).toEqual([expect.objectContaining({ path: "version", message: "Version must be a whole number from 1" })]);
    expect((await call(`/api/progress/${id}`, { cookie: viewer })).status).toBe(200);
    expect((await call(`/api/progress/${id}?version=2`, { method: "DELETE", cookie: inspector })).status).toBe(200);
  });

  it("roles: inspector, engineer and admin write; scheduler and viewer may only read", async () => {
    const s = await createPastScenario(scheduler, projectId, "Progress roles");
    expect((await post(s.id, milling(), viewer)).status).toBe(403);
    expect((await post(s.id, milling(), scheduler)).status).toBe(403);
    const e = await post(s.id, milling(), engineer);
    expect(e.status).toBe(201);
    expect((await call(`/api/progress/${e.body.id}`, { method: "DELETE", cookie: viewer })).status).toBe(403);
    expect((await call(`/api/progress/${e.body.id}`, { cookie: viewer })).status).toBe(200);
    expect((await call(`/api/progress/${e.body.id}`, { cookie: null })).status).toBe(401);
    expect((await call(`/api/progress/00000000-0000-4000-8000-000000000000`, { cookie: viewer })).status).toBe(404);
    expect((await call(`/api/scenarios/${s.id}/reforecast`, { method: "POST", cookie: inspector, body: { dataDate: day(1), seed: "x", iterations: 10 } })).status).toBe(403);
  });

  it("a delete that would leave later work ahead is refused; in order it succeeds", async () => {
    const s = await createPastScenario(scheduler, projectId, "Progress deletes");
    const m = await post(s.id, milling());
    const o = await post(s.id, milling({ operationId: "overlay", fromStationFt: 0, toStationFt: 200 }));
    expect(o.status).toBe(201);
    const refused = await call(`/api/progress/${m.body.id}`, { method: "DELETE", cookie: inspector });
    expect(refused.status).toBe(400);
    expect(refused.body.fields[0].message).toMatch(/Overlay placement entry .* ahead of its predecessor/);
    expect((await call(`/api/progress/${o.body.id}`, { method: "DELETE", cookie: inspector })).status).toBe(200);
    expect((await call(`/api/progress/${m.body.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);

    // Out of the log, kept on record: who deleted what and when, most recent first; gone for reading, editing
    // and deleting again.
    const log = (await call(`/api/scenarios/${s.id}/progress`, { cookie: viewer })).body;
    expect(log.entries).toEqual([]);
    expect(log.deleted.map((d: { id: string }) => d.id)).toEqual([m.body.id, o.body.id]);
    expect(log.deleted[0]).toMatchObject({ operationId: "milling", fromStationFt: 0, toStationFt: 300, enteredByName: "Rosa Tenney", deletedByName: "Dana Whitcomb", deletedAt: expect.any(String) });
    expect(log.deleted[1]).toMatchObject({ operationId: "overlay", deletedByName: "Rosa Tenney" });
    expect((await call(`/api/progress/${m.body.id}`, { cookie: viewer })).status).toBe(404);
    expect((await call(`/api/progress/${m.body.id}`, { method: "PUT", cookie: inspector, body: { ...milling(), version: 1 } })).status).toBe(404);
    expect((await call(`/api/progress/${m.body.id}`, { method: "DELETE", cookie: inspector })).status).toBe(404);
    // The deletion is in the entry's history (before: what it said; after: nothing), by whom.
    const history = await appDb`SELECT h.before->>'operationId' AS op, h.after IS NULL AS deleted, u.name FROM progress_history h JOIN users u ON u.id = h.changed_by WHERE h.entry_id = ${m.body.id} ORDER BY h.changed_at`;
    expect(history).toEqual([{ op: null, deleted: false, name: "Rosa Tenney" }, { op: "milling", deleted: true, name: "Dana Whitcomb" }]);
    // A deleted shift no longer holds its stations: the same milling can be recorded again.
    expect((await post(s.id, milling({ crew: "M3" }))).status).toBe(201);

    // Put back: not the milling (its stretch is recorded again since: the rule named, nothing changed), the overlay
    // yes — as it was recorded, one version on, and its history says so; the viewer may not.
    const blocked = await call(`/api/progress/${m.body.id}/restore`, { method: "POST", cookie: inspector });
    expect(blocked.status).toBe(400);
    expect(blocked.body.fields[0]).toMatchObject({ path: "fromStationFt", message: expect.stringMatching(/^Mechanical milling is already recorded over STA 0\+00–STA 3\+00/) });
    expect((await call(`/api/progress/${o.body.id}/restore`, { method: "POST", cookie: viewer })).status).toBe(403);
    const back = await call(`/api/progress/${o.body.id}/restore`, { method: "POST", cookie: engineer });
    expect(back.status).toBe(200);
    expect(back.body.version).toBe(2);
    const restored = await call(`/api/progress/${o.body.id}`, { cookie: viewer });
    expect(restored.body.entry).toMatchObject({ operationId: "overlay", toStationFt: 200, enteredByName: "Rosa Tenney", version: 2 });
    expect(restored.body.history.map((h: { action: string; changedByName: string }) => `${h.action} by ${h.changedByName}`)).toEqual(["restore by Dana Whitcomb", "delete by Rosa Tenney", "create by Rosa Tenney"]);
    expect((await call(`/api/progress/${o.body.id}/restore`, { method: "POST", cookie: engineer })).status).toBe(404); // not deleted any more
    const afterRestore = (await call(`/api/scenarios/${s.id}/progress`, { cookie: viewer })).body;
    expect(afterRestore.deleted.map((d: { id: string }) => d.id)).toEqual([m.body.id]);
    expect((await call(`/api/progress/${o.body.id}?version=2`, { method: "DELETE", cookie: inspector })).status).toBe(200);

    // The field log as CSV (any member): the shift in the log, not the deleted ones.
    const csv = await call(`/api/scenarios/${s.id}/exports/field-log.csv`, { cookie: viewer });
    expect(csv.status).toBe(200);
    expect(csv.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(csv.headers.get("content-disposition")).toBe('attachment; filename="progress-deletes-field-log.csv"');
    const rows = Papa.parse<Record<string, string>>(csv.body, { header: true, skipEmptyLines: true }).data;
    expect(rows).toEqual([expect.objectContaining({ work_date: day(1), operation: "milling", operation_name: "Mechanical milling", station_from: "STA 0+00", station_to: "STA 3+00", length_ft: "300", crew: "M3", recorded_by: "Rosa Tenney" })]);
    // With the deleted shifts (for an audit): the same shift, and the deleted ones marked with who deleted them and when.
    const audit = await call(`/api/scenarios/${s.id}/exports/field-log.csv?deleted=include`, { cookie: viewer });
    expect(audit.status).toBe(200);
    expect(audit.headers.get("content-disposition")).toBe('attachment; filename="progress-deletes-field-log-with-deleted.csv"');
    const all = Papa.parse<Record<string, string>>(audit.body, { header: true, skipEmptyLines: true }).data;
    expect(all.filter((r) => r.status === "recorded")).toEqual([expect.objectContaining({ crew: "M3", deleted_by: "", deleted_at: "" })]);
    // The milling Dana deleted and the overlay Rosa deleted again after it was put back; three rows in all.
    const deletedRows = all.filter((r) => r.status === "deleted").map((r) => [r.operation, r.crew, r.deleted_by, Number.isNaN(Date.parse(r.deleted_at))]);
    expect(deletedRows.sort()).toEqual([
      ["milling", "M1", "Dana Whitcomb", false],
      ["overlay", "M1", "Rosa Tenney", false],
    ]);
    expect(all).toHaveLength(3);
    // Any other value is refused, naming what was asked for.
    const bad = await call(`/api/scenarios/${s.id}/exports/field-log.csv?deleted=yes`, { cookie: viewer });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual([{ path: "deleted", label: "Deleted shifts in the export", message: "must be include, or left out" }]);
  });
});

describe("re-forecast", () => {
  it("stores a run with its data date that schedules none of the recorded packets, and lists it for the drift chart", async () => {
    const s = await createPastScenario(scheduler, projectId, "Re-forecast");
    const planRun = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "p", iterations: 20 } });
    expect(planRun.status).toBe(202);
    expect((await waitForJob(planRun.body.job.id, scheduler)).status).toBe("completed");
    expect((await post(s.id, milling({ fromStationFt: 0, toStationFt: 500 }))).status).toBe(201);
    expect((await post(s.id, milling({ workDate: day(2), fromStationFt: 500, toStationFt: 1000 }))).status).toBe(201);
    expect((await post(s.id, milling({ workDate: day(2), operationId: "overlay", fromStationFt: 0, toStationFt: 250 }))).status).toBe(201);
    const bad = await call(`/api/scenarios/${s.id}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: day(-3), seed: "r", iterations: 20 } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].path).toBe("dataDate");
    // A data date after today is refused in words: nothing can have been recorded for it yet.
    const future = await call(`/api/scenarios/${s.id}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: isoDaysFromToday(2), seed: "r", iterations: 20 } });
    expect(future.status).toBe(400);
    expect(future.body.fields[0]).toMatchObject({ path: "dataDate", message: expect.stringMatching(/must not be in the future/) });
    const re = await call(`/api/scenarios/${s.id}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: day(2), seed: "r", iterations: 20 } });
    expect(re.status).toBe(202);
    const job = await waitForJob(re.body.job.id, engineer);
    expect(job.status).toBe("completed");
    const run = await call(`/api/runs/${job.runId}`, { cookie: viewer });
    expect(run.body.run.dataDate).toBe(day(2));
    expect(run.body.run.planRun).toBe(false);
    expect(run.body.run.results.reforecast.operations[0]).toMatchObject({ id: "milling", donePackets: 10 });
    expect(run.body.run.results.reforecast.operations[1]).toMatchObject({ id: "overlay", donePackets: 2, partPackets: 1 });
    const packets = run.body.run.results.representative.trace.packets as { op: string; packet: number }[];
    expect(packets.filter((p) => p.op === "milling")).toEqual([]);
    expect(packets.filter((p) => p.op === "overlay").map((p) => p.packet)).toEqual([2, 3, 4, 5, 6, 7, 8, 9]);
    const drift = await call(`/api/scenarios/${s.id}/reforecast`, { cookie: viewer });
    expect(drift.status).toBe(200);
    expect(drift.body.plan.summary.finish.p50).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(drift.body.runs.map((r: { dataDate: string }) => r.dataDate)).toEqual([day(2)]);
    // The project's scenario list carries the newest re-forecast beside the plan run.
    const listed = (await call(`/api/projects/${projectId}/scenarios`, { cookie: viewer })).body.scenarios.find((x: { id: string }) => x.id === s.id);
    expect(listed).toMatchObject({ runId: expect.any(String), reforecastDataDate: day(2), reforecastP80: run.body.run.results.finish.p80 });
  });
});

describe("a forecast behind the field", () => {
  it("counts the field-log changes the plan of record's newest forecast does not know: shifts worked after its data date, recorded or corrected since it was run, or deleted since", async () => {
    // A project of the engineer's own (its administrator): the plan of record of the demo is not this test's to change.
    const made = await call("/api/projects", { method: "POST", cookie: engineer, body: { name: `Dunlin Creek Bridge ${Date.now()}`, structureName: "Dunlin Creek Bridge", deckLengthFt: 1000, startStationFt: 0, lanes: "L1, L2" } });
    expect(made.status).toBe(201);
    const own = made.body.id as string;
    const s = await createPastScenario(engineer, own, "Behind the field");
    expect((await call(`/api/projects/${own}/plan-of-record`, { method: "PUT", cookie: engineer, body: { planScenarioId: s.id } })).status).toBe(200);
    const notIn = async () => (await call("/api/projects", { cookie: engineer })).body.projects.find((p: { id: string }) => p.id === own).planRunShiftsNotIn;
    const forecast = async (path: string, body: Record<string, unknown>) => {
      const queued = await call(`/api/scenarios/${s.id}/${path}`, { method: "POST", cookie: engineer, body: { seed: "behind", iterations: 20, ...body } });
      expect(queued.status).toBe(202);
      expect((await waitForJob(queued.body.job.id, engineer)).status).toBe("completed");
    };

    const first = await post(s.id, milling(), engineer);
    expect(first.status).toBe(201);
    await forecast("runs", {});
    expect(await notIn()).toBe(1); // a plan run knows no shift of the field log
    await forecast("reforecast", { dataDate: day(2) });
    expect(await notIn()).toBe(0);
    const second = await post(s.id, milling({ workDate: day(3), fromStationFt: 300, toStationFt: 600 }), engineer);
    expect(second.status).toBe(201);
    expect(await notIn()).toBe(1); // worked after the data date
    const corrected = await call(`/api/progress/${first.body.id}`, { method: "PUT", cookie: engineer, body: { ...milling({ crew: "M2" }), version: 1 } });
    expect(corrected.status).toBe(200);
    expect(await notIn()).toBe(2); // worked before it, corrected since
    expect((await call(`/api/progress/${second.body.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    expect(await notIn()).toBe(1); // the forecast never used it: deleting it changes nothing it knows
    await forecast("reforecast", { dataDate: day(3) });
    expect(await notIn()).toBe(0);
    expect((await call(`/api/progress/${first.body.id}`, { method: "DELETE", cookie: engineer })).status).toBe(200);
    expect(await notIn()).toBe(1); // the forecast used it: it is behind the field until re-forecast
    await forecast("reforecast", { dataDate: day(3) });
    expect(await notIn()).toBe(0);
    expect((await call(`/api/progress/${first.body.id}/restore`, { method: "POST", cookie: engineer })).status).toBe(200);
    expect(await notIn()).toBe(1); // put back after the forecast: a change it does not know
  });
});

describe("the forecast that stood on a day (the daily report's)", () => {
  it("is the newest run made on or before that day where the work is, by its time zone", async () => {
    const s = await createPastScenario(engineer, projectId, "Standing forecast");
    const queued = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: engineer, body: { seed: "standing", iterations: 20 } });
    expect(queued.status).toBe(202);
    const job = await waitForJob(queued.body.job.id, engineer);
    expect(job.status).toBe("completed");
    // Run at 05:30 UTC on 20 Nov: still the evening of 19 Nov in Chicago.
    await appDb`UPDATE simulation_runs SET created_at = '2026-11-20T05:30:00Z' WHERE id = ${job.runId!}`;
    const on = (day: string, timeZone: string) => getForecastStandingOn({ scenarioId: s.id, day, timeZone });
    expect((await on("2026-11-19", "America/Chicago"))?.createdAt.toISOString()).toBe("2026-11-20T05:30:00.000Z");
    expect(await on("2026-11-19", "UTC")).toBeNull();
    expect(await on("2026-11-18", "America/Chicago")).toBeNull();
    expect((await on("2026-12-01", "UTC"))?.dataDate).toBeNull(); // a plan run
  });
});

describe("the seeded demo is a job under way", () => {
  it("has a field log and drift history before today, and the inspector can log today's shift", async () => {
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: viewer });
    const demo = list.body.scenarios.find((x: { name: string }) => x.name === "Kestrel Bay Causeway — two seasons");
    const def = (await call(`/api/scenarios/${demo.id}`, { cookie: viewer })).body.scenario.definition;
    const today = isoDaysFromToday(0, def.timeZone);
    expect(def.startDate < today).toBe(true);
    const entries = (await call(`/api/scenarios/${demo.id}/progress`, { cookie: viewer })).body.entries as { workDate: string; operationId: string; toStationFt: number }[];
    expect(entries.length).toBeGreaterThan(0);
    expect(entries.every((e) => e.workDate < today)).toBe(true);
    const drift = await call(`/api/scenarios/${demo.id}/reforecast`, { cookie: viewer });
    expect(drift.body.runs.length).toBeGreaterThan(0);
    // Today's setup shift continues where the log stops.
    const reached = Math.max(...entries.filter((e) => e.operationId === "setup").map((e) => e.toStationFt));
    const end = def.deck.startStationFt + def.deck.lengthFt;
    const next = { workDate: today, shift: "night", operationId: "setup", fromStationFt: reached, toStationFt: Math.min(end, reached + 100), crew: "Traffic control crew" };
    if (reached < end) {
      const logged = await post(demo.id, next);
      expect(logged.status).toBe(201);
      expect((await call(`/api/progress/${logged.body.id}`, { method: "DELETE", cookie: inspector })).status).toBe(200);
    }
  });
});
