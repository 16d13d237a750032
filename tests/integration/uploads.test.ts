/** CSV uploads over HTTP: checked as a whole, stored only when every row is good, refused clearly otherwise. */
import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";

let cookie: string;
let scenarioId: string;

beforeAll(async () => {
  cookie = await signInAs("engineer");
  const projectId = (await kestrelProject(cookie)).id;
  const base = await demoDefinition(cookie, projectId);
  const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name: "Upload target", definition: { ...base, name: "Upload target" } } });
  scenarioId = created.body.id;
});

async function upload(fields: Record<string, string>, content: BlobPart, filename: string, type = "text/csv") {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set("file", new Blob([content], { type }), filename);
  const res = await fetch(`${APP_URL}/api/scenarios/${scenarioId}/uploads`, { method: "POST", headers: { cookie, origin: APP_URL }, body: form });
  return { status: res.status, body: await res.json() };
}

const uploadsNow = async () => (await call(`/api/scenarios/${scenarioId}/uploads`, { cookie })).body.uploads.length;
const weatherFields = { kind: "weather", temperature: "F", precipitation: "in", wind: "mph" };

function history(days: number, bad?: number) {
  const lines = ["date,tmax,tmin,precip,wind"];
  for (let i = 0; i < days; i++) {
    const d = new Date(Date.UTC(2020, 0, 1 + i)).toISOString().slice(0, 10);
    lines.push(i === bad ? `${d},warm,40,0,8` : `${d},${50 + (i % 20)},${30 + (i % 15)},${i % 4 === 0 ? 0.2 : 0},${6 + (i % 5)}`);
  }
  return lines.join("\n");
}

describe("uploads", () => {
  it("a good weather history is stored and returns the fitted profile beside the current one", async () => {
    const before = await uploadsNow();
    const res = await upload(weatherFields, history(800), "station.csv");
    expect(res.status).toBe(201);
    expect(res.body.preview.kind).toBe("weather");
    expect(res.body.preview.fit.monthly[0].counts.days).toBeGreaterThan(50);
    expect(res.body.preview.current.monthly).toHaveLength(12);
    expect(await uploadsNow()).toBe(before + 1);
  });

  it("a file with one bad row imports nothing and names the row", async () => {
    const before = await uploadsNow();
    const res = await upload(weatherFields, history(100, 41), "one-bad-row.csv");
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual([{ path: "row 43 · daily maximum temperature", label: "Row 43 · daily maximum temperature", message: '"warm" is not a number' }]);
    expect(res.body.error).toMatch(/nothing was imported/);
    expect(await uploadsNow()).toBe(before);
  });

  it("a file over 5 MB is refused with a clear message", async () => {
    const before = await uploadsNow();
    const big = "date,tmax,tmin,precip\n" + "2020-01-01,50,30,0\n".repeat(300_000);
    expect(big.length).toBeGreaterThan(5 * 1024 * 1024);
    const res = await upload(weatherFields, big, "huge.csv");
    expect(res.status).toBe(413);
    expect(res.body.error).toMatch(/limit is 5 MB/);
    expect(await uploadsNow()).toBe(before);
  });

  it("a non-CSV is refused", async () => {
    const before = await uploadsNow();
    const xlsx = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 6, 0]);
    const res = await upload(weatherFields, xlsx, "history.xlsx", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
    expect(res.status).toBe(415);
    expect(res.body.fields[0].path).toBe("file");
    const renamed = await upload(weatherFields, xlsx, "history.csv");
    expect(renamed.status).toBe(415);
    expect(await uploadsNow()).toBe(before);
  });

  it("a deck survey gives per-range probabilities; units default to the file's and a bad unit is named", async () => {
    const survey = await upload({ kind: "survey" }, "from_station,to_station,condition_rating\n12+00,40+00,6\n40+00,96+00,4\n", "survey.csv");
    expect(survey.status).toBe(201);
    expect(survey.body.preview.ranges).toHaveLength(2);
    // Units left out are read from the file: the answer says how each column was read.
    const noUnits = await upload({ kind: "weather" }, history(10), "w.csv");
    expect(noUnits.status).toBe(201);
    expect(noUnits.body.preview.columns.map((c: { header: string; unitFrom: string | null }) => c.unitFrom)).toEqual([null, "guessed", "guessed", "guessed", "guessed"]);
    const badUnit = await upload({ kind: "weather", temperature: "K", precipitation: "mm" }, history(10), "w.csv");
    expect(badUnit.status).toBe(400);
    expect(badUnit.body.fields).toEqual([expect.objectContaining({ path: "temperature", message: expect.stringMatching(/°F, °C or read from the file/) })]);
  });

  it("a viewer may not upload", async () => {
    const viewer = await signInAs("viewer");
    const form = new FormData();
    form.set("kind", "survey");
    form.set("file", new Blob(["from_station,to_station,repair_share\n"], { type: "text/csv" }), "s.csv");
    const res = await fetch(`${APP_URL}/api/scenarios/${scenarioId}/uploads`, { method: "POST", headers: { cookie: viewer, origin: APP_URL }, body: form });
    expect(res.status).toBe(403);
  });
});
