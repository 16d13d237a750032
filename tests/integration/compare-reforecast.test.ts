/**
 * Compare on a job under way, over HTTP against the running app and its worker: the figures compared are plan runs
 * from each plan's start, so the answer also carries each scenario's newest re-forecast from its field log — the
 * same run the field log shows — and says when the plan changed after it; a scenario never re-forecast has none.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { appDatabase, freshTeam } from "../helpers/fresh-team";
import { serverRunDone, waitForJob } from "../helpers/jobs";
import { isoDaysFromToday, pastDefinition, plusDays } from "../helpers/progress-fixture";
import type { CompareAnswer } from "@/lib/compare-contract";

const db = appDatabase();
let engineer: string;
let projectId: string;
let underWay: string;
let variant: string;

async function create(name: string): Promise<string> {
  const definition = pastDefinition(name);
  definition.targetDate = plusDays(definition.startDate, 40);
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: engineer, body: { name, definition } });
  expect(res.status).toBe(201);
  return res.body.id;
}

const compare = async () => {
  const res = await call(`/api/projects/${projectId}/compare?ids=${underWay},${variant}`, { cookie: engineer });
  expect(res.status).toBe(200);
  return res.body as CompareAnswer;
};

beforeAll(async () => {
  const team = await freshTeam(db, ["engineer"]);
  projectId = team.projectId;
  engineer = await team.members[0].cookie();
  underWay = await create("Compare under way");
  variant = await create("Compare variant");
  for (const id of [underWay, variant]) expect((await serverRunDone(id, engineer, { seed: "plan", iterations: 20 })).status).toBe("completed");
});
afterAll(async () => {
  await db.end({ timeout: 5 });
});

describe("compare on a job under way", () => {
  it("carries the newest re-forecast of a scenario re-forecast from its field log, and none for one never re-forecast", async () => {
    expect((await compare()).scenarios.map((s) => s.reforecast)).toEqual([null, null]);
    const shift = { workDate: isoDaysFromToday(-20), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 300, crew: "M1" };
    expect((await call(`/api/scenarios/${underWay}/progress`, { method: "POST", cookie: engineer, body: shift })).status).toBe(201);
    const dataDate = isoDaysFromToday(-15);
    const asked = await call(`/api/scenarios/${underWay}/reforecast`, { method: "POST", cookie: engineer, body: { dataDate, seed: "field", iterations: 20 } });
    expect(asked.status).toBe(202);
    const job = await waitForJob(asked.body.job.id, engineer);
    expect(job.status).toBe("completed");
    const stored = (await call(`/api/runs/${job.runId}`, { cookie: engineer })).body.run;

    const [a, b] = (await compare()).scenarios;
    // The plan run stays what is compared; the re-forecast is said beside it.
    expect(a.run?.id).not.toBe(job.runId);
    expect(a.reforecast).toEqual({
      dataDate,
      createdAt: stored.createdAt,
      p50: stored.summary.finish.p50,
      p80: stored.summary.finish.p80,
      targetDate: stored.summary.targetDate,
      targetProbability: stored.summary.targetProbability,
      stale: false,
      olderRules: false,
    });
    expect(a.reforecast?.targetDate).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(b.reforecast).toBeNull();
  });

  it("says the re-forecast is stale once the plan changed after it", async () => {
    const current = (await call(`/api/scenarios/${underWay}`, { cookie: engineer })).body.scenario;
    const saved = await call(`/api/scenarios/${underWay}`, {
      method: "PUT",
      cookie: engineer,
      body: { version: current.version, name: current.name, description: "edited after the re-forecast", definition: current.definition, changeNote: "a description only" },
    });
    expect(saved.status).toBe(200);
    expect((await compare()).scenarios[0].reforecast?.stale).toBe(true);
  });
});
