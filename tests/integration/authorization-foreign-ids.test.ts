/**
 * Foreign ids: a caller who may act on their own project must still get 404 for anything of another project,
 * including ids placed inside a path of their own project (another project's subscriber, member or scenario),
 * and the other project's things stay as they were. Every row of the API matrix with an id in its path is tried
 * with each id swapped for a foreign one, as the Kestrel administrator (who may do everything on Kestrel).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call } from "../helpers/app";
import { discoverApiRouteMethods, fillPath } from "../helpers/route-inventory";
import { API_ROWS } from "../helpers/authz-api-rows";
import { buildWorld, must, type World } from "../helpers/authz-world";

let w: World;
beforeAll(async () => {
  w = await buildWorld();
}, 120_000);
afterAll(async () => {
  await w?.db.end();
});

/** Per path parameter, the ids of things the Kestrel admin must not reach through it. */
const FOREIGN: Record<string, (w: World) => { whose: string; id: string }[]> = {
  projectId: (w) => [{ whose: "a project they are not a member of", id: w.strangerProjectId }],
  scenarioId: (w) => [{ whose: "another project's scenario", id: w.stranger.scenarioId }],
  runId: (w) => [{ whose: "another project's run", id: w.stranger.runId }],
  jobId: (w) => [{ whose: "another project's engine job", id: w.stranger.jobId }],
  searchId: (w) => [{ whose: "another project's plan search", id: w.stranger.searchId }],
  entryId: (w) => [{ whose: "another project's progress entry", id: w.stranger.entryId }],
  linkId: (w) => [{ whose: "another project's share link", id: w.stranger.shareLinkId }],
  // Inside Kestrel's own path: the Tern one belongs to a project the admin also runs, and still must not be reachable here.
  subscriberId: (w) => [
    { whose: "another project's subscriber", id: w.stranger.subscriberId },
    { whose: "a subscriber of the admin's other project", id: w.tern.subscriberId },
  ],
  userId: (w) => [{ whose: "a member of another project only", id: w.strangerUserId }],
};

const discovered = discoverApiRouteMethods();
const cases = Object.entries(API_ROWS)
  .filter(([key, row]) => discovered.includes(key) && (row.need.kind === "project" || row.need.kind === "scenario"))
  .flatMap(([key]) => [...key.matchAll(/\[(\w+)\]/g)].map((m) => ({ key, param: m[1] })));

describe("every id in a path, swapped for another project's", () => {
  it("every id parameter of the matrix has foreign ids to try", () => {
    expect(cases.filter((c) => !(c.param in FOREIGN)).map((c) => `${c.key} [${c.param}]`)).toEqual([]);
  });

  it.each(cases)("$key with a foreign [$param]", async ({ key, param }) => {
    const [method, template] = key.split(" ");
    for (const foreign of FOREIGN[param](w)) {
      const prep = await API_ROWS[key].request(w, "admin");
      const url = fillPath(template, { ...prep.params, [param]: foreign.id }) + (prep.query ? `?${prep.query}` : "");
      const res = await call(url, { method, body: prep.body, cookie: w.cookies.admin });
      expect(res.status, `${key} with ${foreign.whose}: ${JSON.stringify(res.body)?.slice(0, 200)}`).toBe(404);
    }
  });
});

describe("foreign ids inside the caller's own project path", () => {
  it("comparing asks only for this project's scenarios", async () => {
    for (const id of [w.stranger.scenarioId, w.tern.scenarioId]) {
      const res = await call(`/api/projects/${w.projectId}/compare?ids=${w.target.id},${id}`, { cookie: w.cookies.admin });
      expect(res.status).toBe(404);
    }
  });

  it("the other project's administrator cannot reach Kestrel's subscribers, members or scenarios through their own project", async () => {
    const own = w.strangerProjectId;
    const sc = w.cookies.otherProjectAdmin;
    const kestrelSubscriber = must(await call(`/api/projects/${w.projectId}/closure-subscribers`, { cookie: w.cookies.admin }), 200, "subscribers").subscribers[0].id;
    const engineerId = must(await call(`/api/projects/${w.projectId}/members`, { cookie: w.cookies.admin }), 200, "members").members.find((m: { role: string }) => m.role === "engineer").userId;
    expect((await call(`/api/projects/${own}/closure-subscribers/${kestrelSubscriber}`, { method: "DELETE", cookie: sc })).status).toBe(404);
    expect((await call(`/api/projects/${own}/members/${engineerId}`, { method: "DELETE", cookie: sc })).status).toBe(404);
    expect((await call(`/api/projects/${own}/compare?ids=${w.target.id}`, { cookie: sc })).status).toBe(404);
    // Nothing of Kestrel's changed.
    const subs = must(await call(`/api/projects/${w.projectId}/closure-subscribers`, { cookie: w.cookies.admin }), 200, "subscribers").subscribers;
    expect(subs.some((s: { id: string }) => s.id === kestrelSubscriber)).toBe(true);
    const members = must(await call(`/api/projects/${w.projectId}/members`, { cookie: w.cookies.admin }), 200, "members").members;
    expect(members.some((m: { userId: string }) => m.userId === engineerId)).toBe(true);
  });

  it("the other projects' things survived every attempt above", async () => {
    const sc = w.cookies.otherProjectAdmin;
    expect((await call(`/api/scenarios/${w.stranger.scenarioId}`, { cookie: sc })).status).toBe(200);
    expect((await call(`/api/progress/${w.stranger.entryId}`, { cookie: sc })).status).toBe(200);
    expect((await call(`/api/runs/${w.stranger.runId}`, { cookie: sc })).status).toBe(200);
    expect((await call(`/api/jobs/${w.stranger.jobId}`, { cookie: sc })).body.job?.status).toBe("completed");
    expect((await call(`/api/searches/${w.stranger.searchId}`, { cookie: sc })).status).toBe(200);
    const links = must(await call(`/api/scenarios/${w.stranger.scenarioId}/share-links`, { cookie: sc }), 200, "links").links;
    expect(links.find((l: { id: string }) => l.id === w.stranger.shareLinkId)?.revokedAt ?? null).toBeNull();
    const subs = must(await call(`/api/projects/${w.strangerProjectId}/closure-subscribers`, { cookie: sc }), 200, "subscribers").subscribers;
    expect(subs.some((s: { id: string }) => s.id === w.stranger.subscriberId)).toBe(true);
    const tern = must(await call(`/api/projects/${w.ternProjectId}/closure-subscribers`, { cookie: w.cookies.admin }), 200, "subscribers").subscribers;
    expect(tern.some((s: { id: string }) => s.id === w.tern.subscriberId)).toBe(true);
  });
});
