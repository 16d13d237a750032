/**
 * A run stored under an earlier revision of the model rules (sim/model-revision.ts): readers are told so, with
 * what changed since, and the same scenario version, seed and iterations asked for again are computed under
 * today's rules rather than answered from the old row.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type postgres from "postgres";
import { call, kestrelProject, signInAs, demoDefinition } from "../helpers/app";
import { appDatabase } from "../helpers/fresh-team";
import { waitForJob } from "../helpers/jobs";
import { newSearch, newSearchLink } from "../helpers/authz-world";
import { MODEL_CHANGES, MODEL_REVISION } from "../../sim/model-revision";

let db: postgres.Sql;
let scheduler: string;
let inspector: string;
let projectId: string;
let base: Record<string, unknown>;

beforeAll(async () => {
  db = appDatabase();
  scheduler = await signInAs("scheduler");
  inspector = await signInAs("inspector");
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
});
afterAll(async () => {
  await db?.end({ timeout: 5 });
});

describe("a run of older model rules", () => {
  it("is marked on the API and the Outlook with what changed, and running the same inputs again computes them anew", async () => {
    expect(MODEL_REVISION).toBeGreaterThan(1);
    const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name: "Older rules", definition: { ...base, name: "Older rules" } } });
    expect(created.status).toBe(201);
    const s = created.body as { id: string; version: number };
    const ask = () => call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "rules", iterations: 20, scenarioVersion: s.version } });
    const first = await ask();
    expect(first.status).toBe(202);
    const done = await waitForJob(first.body.job.id, scheduler);
    expect(done.status).toBe("completed");
    const runId = done.runId as string;

    const fresh = await call(`/api/runs/${runId}`, { cookie: scheduler });
    expect([fresh.body.run.olderRules, fresh.body.run.modelRevision]).toEqual([false, MODEL_REVISION]);
    expect((await call(`/scenarios/${s.id}`, { cookie: scheduler })).body).not.toContain('data-testid="older-rules-run"');

    // As a row stored before revision 2 looks: revision 1, and a result key (and its job's key) without the revision.
    await db`UPDATE simulation_runs SET model_revision = 1, result_key = regexp_replace(result_key, ':m[0-9]+', '') WHERE id = ${runId}`;
    await db`UPDATE engine_jobs SET singleton_key = regexp_replace(singleton_key, ':m[0-9]+', '') WHERE id = ${first.body.job.id}`;
    const old = await call(`/api/runs/${runId}`, { cookie: scheduler });
    expect([old.status, old.body.run.olderRules, old.body.run.modelRevision, old.body.run.stale]).toEqual([200, true, 1, false]);
    const listed = await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler });
    expect(listed.body.runs[0].olderRules).toBe(true);
    // The project's scenario list and Compare say it too (compare runs of different rules are not like with like).
    const list = await call(`/api/projects/${projectId}/scenarios`, { cookie: scheduler });
    expect(list.body.scenarios.find((x: { id: string }) => x.id === s.id).runOlderRules).toBe(true);
    const compared = await call(`/api/projects/${projectId}/compare?ids=${s.id}`, { cookie: scheduler });
    expect(compared.body.scenarios[0].run.olderRules).toBe(true);

    const page = (await call(`/scenarios/${s.id}`, { cookie: scheduler })).body as string;
    expect(page).toContain('data-testid="older-rules-run"');
    expect(page).toContain("This run was computed under earlier model rules; since then " + MODEL_CHANGES[2]);
    expect(page).toContain("Run it again for figures under today’s rules.");
    // Someone who may not run plans is told who can.
    const read = (await call(`/scenarios/${s.id}`, { cookie: inspector })).body as string;
    expect(read).toContain("Figures under today’s rules need someone who runs plans to run it again.");

    // The same version, seed and iterations again: a new computation under today's rules, not the old row.
    const again = await ask();
    expect(again.status).toBe(202);
    const redone = await waitForJob(again.body.job.id, scheduler);
    expect(redone.status).toBe("completed");
    expect(redone.runId).not.toBe(runId);
    const now = await call(`/api/runs/${redone.runId}`, { cookie: scheduler });
    expect([now.body.run.olderRules, now.body.run.modelRevision]).toEqual([false, MODEL_REVISION]);
    expect((await call(`/api/projects/${projectId}/compare?ids=${s.id}`, { cookie: scheduler })).body.scenarios[0].run.olderRules).toBe(false);
    expect((await call(`/scenarios/${s.id}`, { cookie: scheduler })).body).not.toContain('data-testid="older-rules-run"');
  });

  it("a plan search of older rules is said so, to its members and on its share link", async () => {
    const created = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name: "Older rules search", definition: { ...base, name: "Older rules search" } } });
    expect(created.status).toBe(201);
    const searchId = await newSearch(created.body.id, scheduler);
    const link = await newSearchLink(searchId, scheduler);
    const read = async () => [
      (await call(`/api/searches/${searchId}`, { cookie: scheduler })).body.search.olderRules,
      (await call(`/api/shared-search/${link.token}`, { cookie: null })).body.search.olderRules,
    ];
    expect(await read()).toEqual([false, false]);
    await db`UPDATE plan_searches SET model_revision = 1 WHERE id = ${searchId}`;
    expect(await read()).toEqual([true, true]);
  });
});
