/**
 * The planned-closures calendar a scenario's Outlook offers, over HTTP against the running app and its worker: of the
 * plan run by default, of the forecast (on a job under way, the newest re-forecast from the field log) when asked —
 * each event at the local time its run's closure timeline stored, so a plan whose start moved after the run keeps
 * its dates — and a clear refusal of an unknown choice.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { serverRunDone, waitForJob } from "../helpers/jobs";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";

const db = appDatabase();
let engineer: string;
let scenarioId: string;
let planRun: { timeline: TimelinePeriod[] };
let reforecast: { timeline: TimelinePeriod[] };

/** A period of a stored run's closure timeline: local wall-clock times ("2026-11-14T21:00"). */
type TimelinePeriod = { start: string; end: string; lanes: string[] };

async function runOf(runId: string) {
  const results = (await call(`/api/runs/${runId}`, { cookie: engineer })).body.run.results;
  return { timeline: results.representative.closureTimeline as TimelinePeriod[] };
}

/** Each event's local start as the calendar states it ("local 2026-11-14T21:00 to …" in its description), sorted. */
async function calendarStarts(query = ""): Promise<string[]> {
  const res = await call(`/api/scenarios/${scenarioId}/exports/closures.ics${query}`, { cookie: engineer });
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toMatch(/^text\/calendar/);
  return new ICAL.Component(ICAL.parse(res.body as string))
    .getAllSubcomponents("vevent")
    .map((e) => /\(local (\d{4}-\d{2}-\d{2}T\d{2}:\d{2}) to /.exec(String(e.getFirstPropertyValue("description")))![1])
    .sort();
}

/** What the calendar must say: each closed period of the run's timeline at the local time the run stored for it. */
function expectedStarts(run: { timeline: TimelinePeriod[] }): string[] {
  return run.timeline
    .filter((p) => p.end > p.start && p.lanes.length > 0)
    .map((p) => p.start)
    .sort();
}

const weekLater = (iso: string) => new Date(Date.parse(`${iso}T00:00:00Z`) + 7 * 86_400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  const team = await freshTeam(db, ["engineer"]);
  engineer = await team.members[0].cookie();
  scenarioId = (await createPastScenario(engineer, team.projectId, "Closure calendar export")).id;
  const plan = await serverRunDone(scenarioId, engineer, { seed: "calendar", iterations: 20 });
  expect(plan.status).toBe("completed");
  planRun = await runOf(plan.runId!);
  const shift = { workDate: isoDaysFromToday(-20), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 300, crew: "M1" };
  expect((await call(`/api/scenarios/${scenarioId}/progress`, { method: "POST", cookie: engineer, body: shift })).status).toBe(201);
  const asked = await call(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate: isoDaysFromToday(-10), seed: "calendar", iterations: 20 } });
  expect(asked.status).toBe(202);
  const job = await waitForJob(asked.body.job.id, engineer);
  expect(job.status).toBe("completed");
  reforecast = await runOf(job.runId!);
});
afterAll(async () => {
  await db.end({ timeout: 5 });
});

describe("the planned-closures calendar of a scenario", () => {
  it("is of the plan run by default and of the re-forecast when asked for the forecast, each at its run's hours", async () => {
    const plan = expectedStarts(planRun);
    const ahead = expectedStarts(reforecast);
    expect(plan.length).toBeGreaterThan(0);
    expect(ahead.length).toBeGreaterThan(0);
    // The two runs differ (the re-forecast starts from the field log ten days ago), so the check tells them apart.
    expect(ahead).not.toEqual(plan);
    expect(await calendarStarts()).toEqual(plan);
    expect(await calendarStarts("?of=plan-run")).toEqual(plan);
    expect(await calendarStarts("?of=forecast")).toEqual(ahead);
  });

  it("keeps the plan run's dates when the plan's start date moved after it", async () => {
    const current = (await call(`/api/scenarios/${scenarioId}`, { cookie: engineer })).body.scenario;
    const moved = { ...current.definition, startDate: weekLater(current.definition.startDate) };
    const saved = await call(`/api/scenarios/${scenarioId}`, { method: "PUT", cookie: engineer, body: { version: current.version, name: current.name, description: current.description, definition: moved, changeNote: "start a week later" } });
    expect(saved.status).toBe(200);
    // The stored run is unchanged and still says when its closures fall.
    expect(await calendarStarts()).toEqual(expectedStarts(planRun));
  });

  it("refuses a calendar of anything else, naming the choice in words", async () => {
    const res = await call(`/api/scenarios/${scenarioId}/exports/closures.ics?of=tomorrow`, { cookie: engineer });
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual([{ path: "of", label: "Run the calendar is of", message: "must be plan-run or forecast" }]);
  });
});
