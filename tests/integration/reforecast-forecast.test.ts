/**
 * A re-forecast that starts from the weather forecast, over HTTP against the running app, its worker and the
 * weather-service fake: with today's data date and a freshly cached forecast the stored run lists the forecast
 * days (and the fake's cold snap keeps the pours off them), the field log says so in words; an earlier data
 * date, or a forecast too old, runs on the climate profile and lists none. A project of its own, so its
 * location and forecast cache belong to this file alone.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { FAKE_POINTS } from "../helpers/look-ahead-fixture";
import { waitForJob } from "../helpers/jobs";
import { isoDaysFromToday, openInFixture, pastDefinition } from "../helpers/progress-fixture";

const db = appDatabase();
let engineer: string;
let projectId: string;
let scenarioId: string;
let startDate: string;

beforeAll(async () => {
  const team = await freshTeam(db, ["engineer"]);
  projectId = team.projectId;
  engineer = await team.members[0].cookie();
  const definition = pastDefinition("Re-forecast from the forecast"); // started three weeks ago, America/Chicago, overlay ≥ 45 °F
  startDate = definition.startDate;
  const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: engineer, body: { name: definition.name, definition } });
  expect(created.status).toBe(201);
  scenarioId = created.body.id;
  // The fake's "Cold Snap Flats": tomorrow and the day after stay below 41 °F, then mild days.
  expect((await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: engineer, body: FAKE_POINTS.coldSnap })).status).toBe(200);
});
afterAll(async () => {
  await db.end({ timeout: 5 });
});

async function reforecast(dataDate: string, seed: string) {
  const res = await call(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate, seed, iterations: 20 } });
  expect(res.status).toBe(202);
  const job = await waitForJob(res.body.job.id, engineer);
  expect(job.status).toBe("completed");
  return { jobId: res.body.job.id as string, run: (await call(`/api/runs/${job.runId}`, { cookie: engineer })).body.run };
}

const dayOf = (hours: number) => {
  const d = new Date(`${startDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + Math.floor(hours / 24));
  return d.toISOString().slice(0, 10);
};

describe("a re-forecast from the weather forecast", () => {
  it("with today's data date and a fresh forecast: the forecast days are listed, and the cold snap keeps the pours off them", async () => {
    // Reading the week ahead fills the project's forecast cache from the fake.
    const board = await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: engineer });
    expect(board.body.forecast.status).toBe("fresh");
    const today = isoDaysFromToday(0);
    const { jobId, run } = await reforecast(today, "from-forecast");
    // The fake serves 156 hours from the current hour: 5 or 6 whole days after today, from tomorrow on.
    const dates = run.results.forecastDates as string[];
    expect(dates.length).toBeGreaterThanOrEqual(5);
    expect(dates).toEqual(Array.from({ length: dates.length }, (_, i) => isoDaysFromToday(i + 1)));
    expect(run.results.reforecast.weatherForecast.fetchedAt).toMatch(/^\d{4}-\d{2}-\d{2}T/);
    // Milling (no gate) works tomorrow; the overlay (≥ 45 °F) pours on none of the two cold days, then on the first
    // mild day the calendar works (31 Dec is the fixture's winter: a run in the last days of December steps over it).
    const packets = run.results.representative.trace.packets as { op: string; start: number }[];
    const days = (op: string) => new Set(packets.filter((p) => p.op === op).map((p) => dayOf(p.start)));
    expect(days("milling").has(isoDaysFromToday(1))).toBe(openInFixture(isoDaysFromToday(1)));
    expect(days("overlay").has(isoDaysFromToday(1))).toBe(false);
    expect(days("overlay").has(isoDaysFromToday(2))).toBe(false);
    const firstMildOpen = [3, 4].map((n) => isoDaysFromToday(n)).find(openInFixture)!;
    expect(days("overlay").has(firstMildOpen)).toBe(true);
    // Asked again with the same forecast: the same computation, the same job.
    const again = await call(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: today, seed: "from-forecast", iterations: 20 } });
    expect(again.body.job.id).toBe(jobId);
    // The field log says it in words.
    const page = await call(`/scenarios/${scenarioId}/progress`, { cookie: engineer });
    expect(page.status).toBe(200);
    expect(String(page.body)).toContain(`Days 1–${dates.length} after the data date`);
    expect(String(page.body)).toContain("came from the weather forecast fetched");
  });

  it("an earlier data date, or a forecast fetched too long ago, runs on the climate profile and lists no forecast days", async () => {
    const { run } = await reforecast(isoDaysFromToday(-1), "climate");
    expect(run.results.forecastDates).toBeUndefined();
    expect(run.results.reforecast.weatherForecast).toBeUndefined();
    const page = await call(`/scenarios/${scenarioId}/progress`, { cookie: engineer });
    expect(String(page.body)).toContain("The weather came from the climate profile throughout");
    // Seven hours old (beyond the six-hour limit), and the retry pause not over, so nothing is fetched anew.
    await db`UPDATE project_forecasts SET fetched_at = now() - interval '7 hours', last_attempt_at = now() WHERE project_id = ${projectId}`;
    const old = await reforecast(isoDaysFromToday(0), "old-forecast");
    expect(old.run.results.forecastDates).toBeUndefined();
  });
});
