/** Runs: stored with the scenario version they came from, verified by a server job, stale after an edit. */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { parseScenario, runScenario } from "../../sim/index";
import { waitForJob } from "../helpers/jobs";

let scheduler: string;
let projectId: string;
let base: Record<string, unknown>;

beforeAll(async () => {
  scheduler = await signInAs("scheduler");
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
});

async function fresh(name: string) {
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name, definition: { ...base, name } } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number };
}

describe("runs", () => {
  it("a browser-computed summary is stored at once with its version, marked not yet verified", async () => {
    const s = await fresh("Run from browser");
    const parsed = parseScenario({ ...base, name: "Run from browser" });
    if (!parsed.ok) throw new Error("base scenario invalid");
    const summary = runScenario(parsed.scenario, { iterations: 40, seed: "b" });
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "b", iterations: 40, scenarioVersion: s.version, summary, durationMs: 10 } });
    expect(res.status).toBe(201);
    expect(res.body.headline.finish.p80).toBe(summary.finish.p80);
    expect(res.body.verification).toBe("pending");
    const got = await call(`/api/runs/${res.body.id}`, { cookie: scheduler });
    expect(got.body.run.results.finish).toEqual(summary.finish);
    expect(got.body.run.stale).toBe(false);
    expect(got.body.run.planRun).toBe(true);
  });

  it("a summary for other iterations or another seed than the request says is refused, naming the field", async () => {
    const s = await fresh("Mismatched run");
    const parsed = parseScenario({ ...base, name: "Mismatched run" });
    if (!parsed.ok) throw new Error("base scenario invalid");
    const summary = runScenario(parsed.scenario, { iterations: 40, seed: "t" });
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "other", iterations: 40, summary } });
    expect(res.status).toBe(400);
    expect(res.body.fields[0].path).toBe("summary.seed");
    expect((await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler })).body.runs).toHaveLength(0);
  });

  it("a run of an older version is refused; after an edit the stored run is stale", async () => {
    const s = await fresh("Stale run");
    const first = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "s", iterations: 20, scenarioVersion: s.version } });
    expect(first.status).toBe(202);
    expect((await waitForJob(first.body.job.id, scheduler)).status).toBe("completed");
    const put = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "Stale run", definition: { ...base, name: "Stale run", description: "edited" }, version: s.version } });
    expect(put.status).toBe(200);
    const runs = await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler });
    expect(runs.body.runs[0].stale).toBe(true);
    const old = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "s", iterations: 20, scenarioVersion: s.version } });
    expect(old.status).toBe(409);
  });

  it("bad run requests are 400 with the field named", async () => {
    const s = await fresh("Bad run");
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "", iterations: 5 } });
    expect(res.status).toBe(400);
    const paths = res.body.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(["seed", "iterations"]));
    const big = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "x", iterations: 60_000 } });
    expect(big.status).toBe(400);
    expect(big.body.fields[0].path).toBe("iterations");
  });
});
