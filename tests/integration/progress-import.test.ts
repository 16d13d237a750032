/**
 * Loading shifts into the field log from a CSV file, over HTTP against the running app: the check says what a file
 * would add and stores nothing; an inspector loads a file,
 * the shifts are in the log in their name with a history row each; the field log's own download loads into another
 * scenario as the same shifts; a file with one bad row, or one that repeats shifts already recorded, loads nothing
 * and names each line and column.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";

const db = appDatabase();
let engineer: string;
let inspector: { cookie: string; name: string };
let projectId: string;
let scenarioId: string;

const day = (n: number) => isoDaysFromToday(-20 + n);
const csvFile = (text: string, name = "site-log.csv") => {
  const form = new FormData();
  form.set("file", new Blob([text], { type: "text/csv" }), name);
  return form;
};
const load = (id: string, text: string, cookie = inspector.cookie) => call(`/api/scenarios/${id}/progress/import`, { method: "POST", cookie, body: csvFile(text) });
const check = (id: string, text: string, cookie = inspector.cookie) => call(`/api/scenarios/${id}/progress/import/check`, { method: "POST", cookie, body: csvFile(text) });
const entriesOf = async (id: string) => (await call(`/api/scenarios/${id}/progress`, { cookie: engineer })).body.entries as Record<string, unknown>[];
/** An entry's recorded fields (what a shift is), without who recorded it, when, or its id. */
const fieldsOf = (e: Record<string, unknown>) => {
  const { workDate, shift, operationId, fromStationFt, toStationFt, crew, tempF, rain, lostHours, lostReason, discovered } = e;
  return { workDate, shift, operationId, fromStationFt, toStationFt, crew, tempF, rain, lostHours, lostReason, discovered };
};

const byDay = (list: Record<string, unknown>[]) => list.map(fieldsOf).sort((a, b) => String(a.workDate).localeCompare(String(b.workDate)));

const SITE_LOG = [
  "Work date,Shift,Operation,Station from,Station to,Crew,Temp F,Rain,Lost hours,Lost reason,Discovered",
  `${day(0)},Day shift,milling,0+00,3+00,M1,55,no,0,,Bottom-mat exposure STA 1+00–STA 1+50 (12 ft²)`,
  `${day(1)},Day shift,milling,3+00,6+00,M1,,yes,2,"Rain, 07:00–09:00",`,
  `${day(2)},Day shift,overlay,0+00,2+00,"P1, P2",61,no,0,,`,
].join("\n");

beforeAll(async () => {
  const team = await freshTeam(db, ["engineer", "inspector"]);
  projectId = team.projectId;
  engineer = await team.members[0].cookie();
  inspector = { cookie: await team.members[1].cookie(), name: "Test inspector" }; // freshUser names each person "Test <role>"
  scenarioId = (await createPastScenario(engineer, projectId, "Loaded from a file")).id;
});
afterAll(async () => {
  await db.end({ timeout: 5 });
});

describe("shifts loaded from a CSV file", () => {
  it("are checked first: the check says what the file would add, operation by operation, and stores nothing", async () => {
    const other = (await createPastScenario(engineer, projectId, "Checked, not loaded")).id;
    const res = await check(other, SITE_LOG);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      shifts: 3,
      skippedDeleted: 0,
      from: day(0),
      to: day(2),
      operations: [
        { operationId: "milling", name: "Mechanical milling", shifts: 2, feet: 600, first: day(0), last: day(1), lostHours: 2 },
        { operationId: "overlay", name: "Overlay placement", shifts: 1, feet: 200, first: day(2), last: day(2), lostHours: 0 },
      ],
      rainShifts: 1,
      discovered: 1,
    });
    expect(await entriesOf(other)).toEqual([]);
    // A file the import would refuse, the check refuses in the same words.
    const bad = ["work_date,shift,operation,station_from_ft,station_to_ft", `${day(0)},graveyard,milling,0,300`].join("\n");
    const refused = await check(other, bad);
    expect(refused.status).toBe(400);
    expect(refused.body.fields.map((f: { path: string; message: string }) => `${f.path}: ${f.message}`)).toEqual(["row 2 · shift: “graveyard” is not a shift of this plan (Day shift)"]);
    expect(await entriesOf(other)).toEqual([]);
  });

  it("are in the log at once, in the loader's name, each with its history", async () => {
    const res = await load(scenarioId, SITE_LOG);
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ imported: 3, skippedDeleted: 0, from: day(0), to: day(2) });
    const entries = await entriesOf(scenarioId);
    expect(byDay(entries)).toEqual([
      { workDate: day(0), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 300, crew: "M1", tempF: 55, rain: false, lostHours: 0, lostReason: "", discovered: [{ kind: "bottom-mat", fromStationFt: 100, toStationFt: 150, areaSqFt: 12 }] },
      { workDate: day(1), shift: "day", operationId: "milling", fromStationFt: 300, toStationFt: 600, crew: "M1", tempF: null, rain: true, lostHours: 2, lostReason: "Rain, 07:00–09:00", discovered: [] },
      { workDate: day(2), shift: "day", operationId: "overlay", fromStationFt: 0, toStationFt: 200, crew: "P1, P2", tempF: 61, rain: false, lostHours: 0, lostReason: "", discovered: [] },
    ]);
    expect(new Set(entries.map((e) => e.enteredByName))).toEqual(new Set([inspector.name]));
    const history = (await call(`/api/progress/${entries[0].id}`, { cookie: engineer })).body.history;
    expect(history.map((h: { action: string; changedByName: string }) => [h.action, h.changedByName])).toEqual([["create", inspector.name]]);
  });

  it("take the field log's own download into another scenario as the same shifts", async () => {
    const download = await call(`/api/scenarios/${scenarioId}/exports/field-log.csv`, { cookie: engineer });
    expect(download.status).toBe(200);
    const other = (await createPastScenario(engineer, projectId, "Loaded from the download")).id;
    const res = await load(other, download.body as string);
    expect(res.status).toBe(201);
    expect(res.body.imported).toBe(3);
    expect(byDay(await entriesOf(other))).toEqual(byDay(await entriesOf(scenarioId)));
  });

  it("load nothing when one row is wrong, naming its line and column", async () => {
    const other = (await createPastScenario(engineer, projectId, "One bad row")).id;
    const text = ["work_date,shift,operation,station_from_ft,station_to_ft", `${day(0)},day,milling,0,300`, `${day(1)},graveyard,milling,300,600`].join("\n");
    const res = await load(other, text);
    expect(res.status).toBe(400);
    expect(res.body.error).toBe("The file has 1 problem; nothing was imported. Fix it and upload again.");
    expect(res.body.fields.map((f: { path: string; message: string }) => `${f.path}: ${f.message}`)).toEqual(["row 3 · shift: “graveyard” is not a shift of this plan (Day shift)"]);
    expect(await entriesOf(other)).toEqual([]);
  });

  it("load nothing when the file repeats shifts already recorded", async () => {
    const before = (await entriesOf(scenarioId)).length;
    const res = await load(scenarioId, SITE_LOG);
    expect(res.status).toBe(400);
    expect(res.body.fields.map((f: { path: string }) => f.path)).toEqual(["row 2 · station_from", "row 3 · station_from", "row 4 · station_from"]);
    expect(res.body.fields[0].message).toMatch(/^Mechanical milling is already recorded over STA 0\+00–STA 3\+00/);
    expect((await entriesOf(scenarioId)).length).toBe(before);
  });
});
