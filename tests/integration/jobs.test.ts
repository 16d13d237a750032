/**
 * Engine work on the queue, end to end against the running app and its worker: server runs, verification of
 * browser runs (a genuine one becomes verified, a doctored one never counts as the forecast), the web server
 * staying responsive during the heaviest allowed run, cancel freeing the worker, kill -9 of the worker
 * mid-job, and a plan search over a small grid.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { waitForJob, withAppDb } from "../helpers/jobs";
import { parseScenario, runScenario, type Scenario } from "../../sim/index";
import { applyVariant, type SearchDimension } from "../../sim/search";
import { outcomeOf } from "../../sim/frontier";
import { MAX_SERVER_ITERATIONS } from "../../src/lib/schemas";

let scheduler: string;
let projectId: string;
let base: Record<string, unknown>;

beforeAll(async () => {
  scheduler = await signInAs("scheduler");
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
}, 60_000);

async function fresh(name: string, definition: Record<string, unknown> = base) {
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name, definition: { ...definition, name } } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number };
}

function plan(name: string): Scenario {
  const parsed = parseScenario({ ...base, name });
  if (!parsed.ok) throw new Error("base scenario invalid");
  return parsed.scenario;
}

describe("server runs", () => {
  it("a run without a summary is a job; the worker stores the engine's result once, however often it is asked for", async () => {
    const s = await fresh("Queued run");
    const body = { seed: "srv", iterations: 30 };
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body });
    expect(res.status).toBe(202);
    const again = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body });
    expect(again.body.job.id).toBe(res.body.job.id);
    const job = await waitForJob(res.body.job.id, scheduler);
    expect(job.status).toBe("completed");
    const run = await call(`/api/runs/${job.runId}`, { cookie: scheduler });
    expect(run.body.run.verification).toBe("server");
    expect(run.body.run.results.finish).toEqual(runScenario(plan("Queued run"), body).finish);
    expect((await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body })).body.job.id).toBe(res.body.job.id);
    expect((await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler })).body.runs).toHaveLength(1);
  });

  it("a run beyond the work budget is refused at once, naming the iterations", async () => {
    const long = { ...base, deck: { ...(base.deck as object), lengthFt: 50_000 } };
    const s = await fresh("Too much work", long);
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "x", iterations: MAX_SERVER_ITERATIONS } });
    expect(res.status).toBe(400);
    expect(res.body.fields[0].path).toBe("iterations");
    expect(res.body.fields[0].message).toMatch(/At most [\d,]+ iterations fit/);
  });
});

describe("verified forecasts", () => {
  it("a genuine browser run is stored at once as not yet verified and becomes verified", async () => {
    const s = await fresh("Genuine browser run");
    const summary = runScenario(plan("Genuine browser run"), { iterations: 40, seed: "g" });
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "g", iterations: 40, scenarioVersion: s.version, summary } });
    expect(res.status).toBe(201);
    expect(res.body.verification).toBe("pending");
    const job = await waitForJob(res.body.verifyJobId, scheduler);
    expect(job.status).toBe("completed");
    const run = await call(`/api/runs/${res.body.id}`, { cookie: scheduler });
    expect(run.body.run.verification).toBe("verified");
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
    const row = list.body.scenarios.find((x: { id: string }) => x.id === s.id);
    expect(row.runId).toBe(res.body.id);
    expect(row.runVerification).toBe("verified");
  });

  it("a doctored summary (P80 moved, probability 1) is rejected and never shown as the forecast", async () => {
    const s = await fresh("Doctored browser run");
    const summary = runScenario(plan("Doctored browser run"), { iterations: 40, seed: "d" });
    const doctored = { ...summary, finish: { ...summary.finish, p80: summary.finish.p10 }, target: summary.target ? { ...summary.target, probability: 1 } : { date: "2030-01-01", probability: 1 } };
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "d", iterations: 40, summary: doctored } });
    expect(res.status).toBe(201);
    await waitForJob(res.body.verifyJobId, scheduler);
    expect((await call(`/api/runs/${res.body.id}`, { cookie: scheduler })).body.run.verification).toBe("rejected");
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
    const row = list.body.scenarios.find((x: { id: string }) => x.id === s.id);
    expect(row.runId).toBeNull(); // no forecast at all: the only run is the rejected one
    const compare = await call(`/api/projects/${projectId}/compare?ids=${s.id}`, { cookie: scheduler });
    expect(compare.body.scenarios[0].run).toBeNull();
    const csv = await call(`/api/scenarios/${s.id}/exports/results.csv`, { cookie: scheduler });
    expect(csv.status).not.toBe(200);
  });
});

describe("plan search", () => {
  it("a search over a small grid returns every variant, and its frontier is the non-dominated set", async () => {
    const s = await fresh("Search grid");
    const crewOp = (base.operations as { id: string; kind: string }[]).find((o) => o.kind === "crew")!.id;
    const spec = {
      dimensions: [
        { kind: "holidayPolicy", values: ["standDown", "workThrough"] },
        { kind: "crews", operation: crewOp, values: [1, 2] },
      ],
      maxVariants: 10,
      iterations: 100,
      seed: "grid",
    };
    const res = await call(`/api/scenarios/${s.id}/searches`, { method: "POST", cookie: scheduler, body: { name: "grid", spec } });
    expect(res.status).toBe(202);
    expect(res.body.search).toMatchObject({ method: "grid", gridSize: 4 });
    await waitForJob(res.body.job.id, scheduler, { timeoutMs: 180_000 });
    const got = await call(`/api/searches/${res.body.search.id}`, { cookie: scheduler });
    const variants = got.body.variants as { idx: number; choice: number[] | null; status: string; onFrontier: boolean; outcome: { p80Finish: string; delayVehHours: number | null; contractCost: number | null } }[];
    expect(variants).toHaveLength(5); // the plan as saved, and 2 × 2 variants
    expect(variants.map((v) => v.choice)).toEqual([null, [0, 0], [0, 1], [1, 0], [1, 1]]);
    expect(variants.every((v) => v.status === "done")).toBe(true);
    const obj = variants.map((v) => [v.outcome.p80Finish === "unfinished" ? Infinity : Date.parse(v.outcome.p80Finish), v.outcome.delayVehHours ?? 0, v.outcome.contractCost ?? 0]);
    const dominated = obj.map((p, i) => obj.some((q, j) => j !== i && q.every((x, k) => x <= p[k]) && q.some((x, k) => x < p[k])));
    expect(variants.map((v) => v.onFrontier)).toEqual(dominated.map((d) => !d));
    // The same seed for every plan: the saved plan and its identical variant give identical outcomes.
    const policies: string[] = ["standDown", "workThrough"];
    const basePolicy = (base.calendar as { holidays: { policy: string } }).holidays.policy;
    expect(variants[0].outcome).toEqual(variants[policies.indexOf(basePolicy) * 2 + 1].outcome);
  }, 240_000);
});

describe("cancel", () => {
  it("the scheduler who started a job may cancel it; a second cancel is a conflict", async () => {
    const s = await fresh("Owner cancels");
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: `own-${Date.now()}`, iterations: MAX_SERVER_ITERATIONS } });
    expect(res.status).toBe(202);
    const del = await call(`/api/jobs/${res.body.job.id}`, { method: "DELETE", cookie: scheduler });
    expect(del.status).toBe(200);
    expect(del.body.job.status).toBe("cancelled");
    const again = await call(`/api/jobs/${res.body.job.id}`, { method: "DELETE", cookie: scheduler });
    expect(again.status).toBe(409);
  });
});

/**
 * A plan search over the crews of the first two crew operations (`levels` of each; a grid larger than
 * `maxVariants` is sampled) at 5,000 iterations per plan (the most a variant may run): the longest job anyone
 * may start, several seconds of engine work per plan on any machine, so that a cancel or a kill lands while it
 * runs. (A single run is no longer long enough: the demo's 5,000 iterations once finished on a faster machine
 * before the test's cancel arrived.)
 */
function longSearch(levels: [number[], number[]], maxVariants: number, seed: string) {
  const crewOps = (base.operations as { id: string; kind: string }[]).filter((o) => o.kind === "crew").map((o) => o.id);
  return {
    dimensions: [
      { kind: "crews", operation: crewOps[0], values: levels[0] },
      { kind: "crews", operation: crewOps[1], values: levels[1] },
    ],
    maxVariants,
    iterations: 5_000,
    seed,
  };
}

const TEN = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

interface VariantRow {
  idx: number;
  choice: number[] | null;
  status: string;
  outcome: unknown;
}

// Last in the file: its long local recomputation leaves the HTTP connections idle long enough for the server
// to close them, which a following request in this file could race with.
describe("the worker", () => {
  it("the session route answers promptly while a long plan search runs; cancel stops it and frees the worker", async () => {
    const s = await fresh("Long search");
    const res = await call(`/api/scenarios/${s.id}/searches`, { method: "POST", cookie: scheduler, body: { name: "long", spec: longSearch([TEN, TEN], 60, `long-${Date.now()}`) } });
    expect(res.status).toBe(202);
    const jobId = res.body.job.id;
    await waitForJob(jobId, scheduler, { until: (j) => j.status === "running" && j.progress.done > 0, timeoutMs: 180_000 });
    for (let i = 0; i < 5; i++) {
      const t0 = performance.now();
      const session = await call("/api/auth/session", { cookie: scheduler });
      // A generous bound: the web server never runs the engine, so this is a database round trip.
      expect(performance.now() - t0).toBeLessThan(5_000);
      expect(session.status).toBe(200);
    }
    const del = await call(`/api/jobs/${jobId}`, { method: "DELETE", cookie: scheduler });
    expect(del.status).toBe(200);
    const stopped = await call(`/api/jobs/${jobId}`, { cookie: scheduler });
    expect(stopped.body.job.status).toBe("cancelled");
    // The freed thread takes the next job: a small run completes long before the search could have.
    const small = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "after-cancel", iterations: 20 } });
    const done = await waitForJob(small.body.job.id, scheduler, { timeoutMs: 90_000 });
    expect(done.status).toBe("completed");
    const after = await call(`/api/jobs/${jobId}`, { cookie: scheduler });
    expect(after.body.job.status).toBe("cancelled");
    // The variants not reached were never computed.
    const search = await call(`/api/searches/${res.body.search.id}`, { cookie: scheduler });
    const variants = search.body.variants as VariantRow[];
    expect(variants.length).toBeGreaterThan(10); // the plan and the sampled variants (a sample may repeat a choice; repeats are dropped)
    expect(variants.filter((v) => v.status === "pending").length).toBeGreaterThan(0);
  }, 300_000);

  it("kill -9 of the worker mid-job: the job is retried and each result stored exactly once", async () => {
    const s = await fresh("Killed worker");
    // A full grid of 4 × 2 crews: eight variants and the plan, nine plans.
    const spec = longSearch([[1, 2, 3, 4], [1, 2]], 8, `kill-${Date.now()}`);
    const res = await call(`/api/scenarios/${s.id}/searches`, { method: "POST", cookie: scheduler, body: { name: "kill", spec } });
    expect(res.status).toBe(202);
    const jobId = res.body.job.id;
    const searchId = res.body.search.id;
    await waitForJob(jobId, scheduler, { until: (j) => j.status === "running" && j.progress.done > 0, timeoutMs: 120_000 });
    const pids = await withAppDb((sql) => sql<{ pid: number }[]>`select pid from engine_workers`);
    expect(pids.length).toBeGreaterThan(0);
    // The variant in hand when the worker dies: the first one not yet done.
    const inHand = await withAppDb((sql) => sql<{ idx: number }[]>`select idx from plan_search_variants where search_id = ${searchId} and status = 'pending' order by idx limit 1`);
    for (const { pid } of pids) {
      try {
        process.kill(pid, "SIGKILL");
      } catch {
        // A row of a worker that already stopped: another worker removes it.
      }
    }
    // The kill landed mid-job (else this test would prove nothing): nobody finished it.
    expect(inHand).toHaveLength(1);
    const atKill = await call(`/api/jobs/${jobId}`, { cookie: scheduler });
    expect(atKill.body.job.status).toBe("running");
    // npm test restarts the worker (as a service manager would); it hands the dead worker's job back.
    const job = await waitForJob(jobId, scheduler, { timeoutMs: 240_000 });
    expect(job.status).toBe("completed");
    const rows = await withAppDb((sql) => sql<{ n: number }[]>`select count(*)::int as n from plan_search_variants where search_id = ${searchId}`);
    expect(rows[0].n).toBe(9);
    const got = await call(`/api/searches/${searchId}`, { cookie: scheduler });
    const variants = got.body.variants as VariantRow[];
    expect(variants.every((v) => v.status === "done")).toBe(true);
    // The variant computed again after the kill is what the engine computes for that plan.
    const v = variants.find((x) => x.idx === inHand[0].idx)!;
    const parsed = parseScenario(v.choice ? applyVariant(plan("Killed worker"), spec.dimensions as SearchDimension[], v.choice) : plan("Killed worker"));
    if (!parsed.ok) throw new Error("variant invalid");
    expect(v.outcome).toEqual(JSON.parse(JSON.stringify(outcomeOf(runScenario(parsed.scenario, { iterations: spec.iterations, seed: spec.seed })))));
  }, 400_000);
});
