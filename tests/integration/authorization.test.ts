/**
 * The API authorization matrix: every route-method found under src/app/api × every caller — the five demo roles,
 * signed out, the administrator of another project, a share-link token and a closure-calendar feed token. The
 * expected answer of each cell comes from the row's need and the role table (tests/helpers/authz-api-rows.ts);
 * a route without a row, or a row without a route, fails the first block.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call } from "../helpers/app";
import { discoverApiRouteMethods, fillPath } from "../helpers/route-inventory";
import { API_ROWS, expectedStatus } from "../helpers/authz-api-rows";
import { buildWorld, CALLERS, present, type World } from "../helpers/authz-world";

const discovered = discoverApiRouteMethods();
const rows = Object.keys(API_ROWS).filter((k) => discovered.includes(k));
let w: World;

beforeAll(async () => {
  w = await buildWorld();
}, 120_000);
afterAll(async () => {
  await w?.db.end();
});

describe("the matrix covers the app", () => {
  it("every route-method under src/app/api has a row", () => {
    expect(discovered.length).toBeGreaterThan(40);
    expect(discovered.filter((k) => !(k in API_ROWS)), "route-methods without a row in tests/helpers/authz-api-rows.ts").toEqual([]);
  });
  it("every row names a route-method that exists", () => {
    expect(Object.keys(API_ROWS).filter((k) => !discovered.includes(k)), "rows for routes that do not exist").toEqual([]);
  });
});

describe.each(rows)("%s", (key) => {
  const row = API_ROWS[key];
  const [method, template] = key.split(" ");
  it.each(CALLERS)("as %s", async (caller) => {
    const want = expectedStatus(row, caller);
    const prep = await row.request(w, caller);
    const url = fillPath(template, prep.params) + (prep.query ? `?${prep.query}` : "");
    const [path, opts] = present(w, caller, url, { method, body: prep.body, cookie: prep.cookie });
    const res = await call(path, opts);
    expect(res.status, `${key} as ${caller}: ${JSON.stringify(res.body)?.slice(0, 300)}`).toBe(want);
    if (res.status >= 400) expect(typeof res.body?.error, "a refusal says why in words").toBe("string");
    if (prep.survives) expect(await prep.survives(), "the victim is gone exactly when the call was allowed").toBe(want >= 400);
  });
});

describe("cross-site requests", () => {
  const scenarioBody = () => ({ name: "cross-site", definition: { ...w.base, name: "cross-site" } });
  it("a state-changing call with another site's Origin, or none, is refused before it reaches the handler", async () => {
    const path = `/api/projects/${w.projectId}/scenarios`;
    for (const origin of ["http://evil.example", null]) {
      const res = await call(path, { method: "POST", cookie: w.cookies.admin, origin, body: scenarioBody() });
      expect(res.status, `origin ${origin}`).toBe(403);
    }
  });
  it("the whole origin is compared: the same host with another scheme or port is another site", async () => {
    const own = new URL(APP_URL);
    const others = [`https://${own.host}`, `${own.protocol}//${own.hostname}:${Number(own.port || 80) + 1}`];
    for (const origin of others) {
      const res = await call(`/api/projects/${w.projectId}/scenarios`, { method: "POST", cookie: w.cookies.admin, origin, body: scenarioBody() });
      expect(res.status, `origin ${origin}`).toBe(403);
      expect(typeof res.body.error).toBe("string");
    }
  });
});
