/**
 * Input limits over HTTP (issue 9, rows 1, 2, 10, 11, 12): the scenario format's lengths, the work budget
 * before every run, the strict run body, the parsed scenario stored (unknown keys dropped, never published),
 * real dates and zones, capped error lists, NUL characters, deep nesting and oversize bodies on every JSON route.
 * Every refusal lists problems as `{ path, label, message }`.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { APP_URL, call, demoDefinition, kestrelProject, signInAs } from "../helpers/app";
import { createPastScenario, isoDaysFromToday } from "../helpers/progress-fixture";
import { newSearch } from "../helpers/authz-world";
import { parseScenario, runScenario } from "../../sim/index";

const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
let scheduler: string;
let admin: string;
let projectId: string;
let base: Record<string, any>;

beforeAll(async () => {
  [scheduler, admin] = await Promise.all([signInAs("scheduler"), signInAs("admin")]);
  projectId = (await kestrelProject(scheduler)).id;
  base = await demoDefinition(scheduler, projectId);
});
afterAll(async () => {
  await appDb.end();
});

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x));
const scenarioCount = async () => (await appDb`SELECT count(*)::int AS n FROM scenarios WHERE project_id = ${projectId}`)[0].n as number;
const field = (body: any, path: string) => body.fields.find((f: { path: string }) => f.path === path);

async function save(name: string, definition: Record<string, unknown>) {
  return call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie: scheduler, body: { name, definition: { ...definition, name } } });
}

async function created(name: string, definition: Record<string, unknown> = base) {
  const res = await save(name, definition);
  expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(201);
  return res.body as { id: string; version: number };
}

/** POST with a streamed body: no Content-Length, so only counting while reading can stop it. */
async function postStreamed(path: string, cookie: string, bytes: number) {
  const chunk = new TextEncoder().encode(" ".repeat(65_536));
  let sent = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(c) {
      if (sent >= bytes) return c.close();
      sent += chunk.byteLength;
      c.enqueue(chunk);
    },
  });
  const res = await fetch(`${APP_URL}${path}`, { method: "POST", headers: { "content-type": "application/json", cookie, origin: APP_URL }, body, duplex: "half" } as RequestInit);
  return { status: res.status, body: await res.json().catch(() => null) };
}

describe("the scenario format's limits", () => {
  it("the issue's attack is refused: 413 at full size, and at under 1 MB a 400 naming each over-long list with its count", async () => {
    const before = await scenarioCount();
    const attack = clone(base);
    attack.deck.lengthFt = 50_000;
    attack.deck.packetFt = 10;
    attack.links = Array.from({ length: 50_000 }, () => ({ from: "milling", to: "overlay" }));
    attack.deck.survey = Array.from({ length: 40_000 }, (_, i) => ({ fromStationFt: 1_200 + i, toStationFt: 1_201 + i, probability: 0.1 }));
    const full = await save("Attack", attack);
    expect(full.status).toBe(413);
    expect(full.body.error).toBe("The request is larger than 1 MB; nothing was saved.");

    attack.links = attack.links.slice(0, 5_000);
    attack.deck.survey = attack.deck.survey.slice(0, 4_000);
    const smaller = await save("Attack", attack);
    expect(smaller.status).toBe(400);
    expect(field(smaller.body, "definition.links")).toEqual({ path: "definition.links", label: "Links", message: "at most 200 links (got 5,000)" });
    expect(field(smaller.body, "definition.deck.survey")).toEqual({ path: "definition.deck.survey", label: "Deck › Survey ranges", message: "at most 500 survey ranges (got 4,000)" });
    expect(await scenarioCount()).toBe(before);
  });

  it("200,000 bad dates are one problem (the list is too long), and long lists of problems give the first 100 and a count", async () => {
    const many = clone(base);
    many.calendar.holidays.blackoutDates = Array.from({ length: 200_000 }, () => "x");
    const one = await save("Many bad dates", many);
    expect(one.status).toBe(400);
    expect(one.body.fields).toEqual([{ path: "definition.calendar.holidays.blackoutDates", label: "Calendar › Holidays › Blackout dates", message: "at most 500 dates (got 200,000)" }]);

    const bad = clone(base);
    bad.calendar.holidays.blackoutDates = Array.from({ length: 450 }, () => "x");
    bad.weather.fixedWetDates = Array.from({ length: 450 }, () => "2027-02-30");
    const res = await save("Many bad dates", bad);
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveLength(100);
    expect(res.body.moreProblems).toBe(800);
    expect(res.body.error).toBe("The scenario has problems; nothing was saved. The first 100 problems are listed (and 800 more problems).");
    expect(res.body.fields[0]).toEqual({ path: "definition.calendar.holidays.blackoutDates[0]", label: "Calendar › Holidays › Blackout date 1", message: "must be a date YYYY-MM-DD" });
    expect(JSON.stringify(res.body).length).toBeLessThan(30_000);
  });

  it("only real dates and real time zones", async () => {
    const res = await save("Unreal", { ...base, startDate: "2027-02-30", timeZone: "Z".repeat(100_000) });
    expect(res.status).toBe(400);
    expect(field(res.body, "definition.startDate")).toEqual({ path: "definition.startDate", label: "Start date", message: "30 Feb 2027 is not a real date" });
    expect(field(res.body, "definition.timeZone").message).toBe("must be an IANA time zone such as America/Chicago (got 100,000 characters)");
    expect(JSON.stringify(res.body)).not.toContain("ZZZZZZZZ");
    const zone = await save("Unknown zone", { ...base, timeZone: "Kestrel/Bay" });
    expect(field(zone.body, "definition.timeZone").message).toBe('"Kestrel/Bay" is not an IANA time zone (e.g. America/Chicago)');
    const reforecast = await call(`/api/scenarios/${(await created("Reforecast date")).id}/reforecast`, { method: "POST", cookie: scheduler, body: { dataDate: "2027-02-29", seed: "s", iterations: 10 } });
    expect(reforecast.status).toBe(400);
    expect(field(reforecast.body, "dataDate").message).toBe("Data date: 29 Feb 2027 is not a real date");
  });
});

describe("what is stored is the parsed scenario", () => {
  it("unknown keys (internalNotes) are dropped on create, update and variant, and never published through a share link", async () => {
    const withNotes: Record<string, any> = { ...clone(base), internalNotes: "bid strategy: undercut by 8 %", deck: { ...base.deck, internalNotes: "x" } };
    withNotes.operations[0].internalNotes = "y";
    const s = await created("Notes dropped", withNotes);
    const stored = async (id: string) => JSON.stringify((await appDb`SELECT definition FROM scenarios WHERE id = ${id}`)[0].definition);
    expect(await stored(s.id)).not.toContain("internalNotes");
    const got = await call(`/api/scenarios/${s.id}`, { cookie: scheduler });
    expect(JSON.stringify(got.body)).not.toContain("internalNotes");
    // The parse output is what was stored: defaults are written out.
    expect(got.body.scenario.definition.operations[0].mobilizationHours).toBeTypeOf("number");

    const put = await call(`/api/scenarios/${s.id}`, { method: "PUT", cookie: scheduler, body: { name: "Notes dropped", definition: { ...withNotes, name: "Notes dropped" }, version: s.version } });
    expect(put.status).toBe(200);
    expect(await stored(s.id)).not.toContain("internalNotes");

    const variant = await call(`/api/scenarios/${s.id}/variants`, { method: "POST", cookie: scheduler, body: { name: "Notes variant" } });
    expect(variant.status).toBe(201);
    expect(await stored(variant.body.id)).not.toContain("internalNotes");

    const link = await call(`/api/scenarios/${s.id}/share-links`, { method: "POST", cookie: scheduler, body: { expiresInDays: 1, label: "notes" } });
    expect(link.status).toBe(201);
    const shared = await call(`/api/shared/${link.body.token}`, { cookie: null });
    expect(shared.status).toBe(200);
    expect(shared.body.scenario.definition.operations.length).toBeGreaterThan(0);
    expect(JSON.stringify(shared.body)).not.toContain("internalNotes");
    const page = await fetch(`${APP_URL}${link.body.path}`);
    expect(await page.text()).not.toContain("internalNotes");
  });
});

describe("the run body", () => {
  it("an unknown field, at the top or inside the summary (2 MB of junk), is refused by name and nothing is stored", async () => {
    const s = await created("Strict run");
    const parsed = parseScenario({ ...base, name: "Strict run" });
    if (!parsed.ok) throw new Error("base scenario invalid");
    const summary: any = clone(runScenario(parsed.scenario, { iterations: 20, seed: "j" }));
    const top = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "j", iterations: 20, summary, internalNotes: "x" } });
    expect(top.status).toBe(400);
    expect(top.body.fields).toEqual([{ path: "internalNotes", label: "Internal notes", message: "is not a known field (unknown fields are refused)" }]);
    summary.junk = "j".repeat(2 * 1024 * 1024);
    const junk = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "j", iterations: 20, summary } });
    expect(junk.status).toBe(400);
    expect(junk.body.fields).toEqual([{ path: "summary.junk", label: "Run summary › Junk", message: "is not a known field (unknown fields are refused)" }]);
    delete summary.junk;
    summary.target.probability = 7;
    const prob = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "j", iterations: 20, summary } });
    expect(prob.status).toBe(400);
    expect(prob.body.fields[0].path).toBe("summary.target.probability");
    expect((await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler })).body.runs).toHaveLength(0);
  });

  it("a run body over 8 MB is 413 with a plain message", async () => {
    const s = await created("Huge run body");
    const res = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "h", iterations: 20, pad: "p".repeat(9 * 1024 * 1024) } });
    expect(res.status).toBe(413);
    expect(res.body.error).toBe("The request is larger than 8 MB; nothing was saved.");
  });
});

describe("the work budget, before any run", () => {
  it("a heavy scenario saves, but its server run, browser run and re-forecast are refused saying which limit and by how much", async () => {
    // 840 packets (10 ft) × 7 operations × 7 + 2,192 weather days = 43,352 units per iteration.
    const heavy = { ...clone(base), deck: { ...base.deck, packetFt: 10 } };
    const s = await created("Heavy deck", heavy);

    const server = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "h", iterations: 1_000 } });
    expect(server.status).toBe(400);
    expect(server.body.fields[0].path).toBe("iterations");
    expect(server.body.fields[0].message).toContain("needs 43,352,000 work units (840 packets × 7 operations at 7 units each + 2,192 weather days, × 1,000 iterations): 1.1 times the limit of 40,000,000 for a run the server computes");

    const parsed = parseScenario({ ...heavy, name: "Heavy deck" });
    if (!parsed.ok) throw new Error("heavy scenario invalid");
    const summary = runScenario(parsed.scenario, { iterations: 10, seed: "h" });
    const browser = await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "h", iterations: 5_000, summary: { ...summary, iterations: 5_000 } } });
    expect(browser.status).toBe(400);
    expect(browser.body.fields[0].message).toContain("1.4 times the limit of 150,000,000 for a run in the browser");

    const reforecast = await call(`/api/scenarios/${s.id}/reforecast`, { method: "POST", cookie: scheduler, body: { dataDate: base.startDate, seed: "h", iterations: 1_000 } });
    expect(reforecast.status).toBe(400);
    expect(reforecast.body.fields[0].message).toContain("for a run the server computes");
    expect((await call(`/api/scenarios/${s.id}/runs`, { cookie: scheduler })).body.runs).toHaveLength(0);

    // Within the budget the same scenario runs.
    expect((await call(`/api/scenarios/${s.id}/runs`, { method: "POST", cookie: scheduler, body: { seed: "h", iterations: 20 } })).status).toBe(202);
  });
});

describe("the small PUT routes (one's account, a project's archive, plan of record, forecast e-mails, the daily re-forecast and the weekly closure e-mail): the same checks, a smaller limit", () => {
  // Each on an account or project of its own, so a body that is valid by mistake changes nothing another test reads.
  let routes: { path: string; cookie: string; valid: Record<string, unknown>; textField: string; limit: string }[];
  beforeAll(async () => {
    const own = await call("/api/projects", { method: "POST", cookie: scheduler, body: { name: "Body checks project", structureName: "S", deckLengthFt: 500, startStationFt: 0, lanes: "L1" } });
    expect(own.status).toBe(201);
    routes = [
      { path: "/api/account", cookie: scheduler, valid: { name: "Marco Ilves", title: "Contractor scheduler" }, textField: "title", limit: "4 KB" },
      { path: `/api/projects/${own.body.id}`, cookie: scheduler, valid: { name: "Body checks project", structureName: "S", deckLengthFt: 500, startStationFt: 0, lanes: "L1" }, textField: "region", limit: "64 KB" },
      { path: `/api/projects/${own.body.id}/archive`, cookie: scheduler, valid: { archived: false }, textField: "archived", limit: "1 KB" },
      { path: `/api/projects/${own.body.id}/plan-of-record`, cookie: scheduler, valid: { planScenarioId: null }, textField: "planScenarioId", limit: "1 KB" },
      { path: `/api/projects/${own.body.id}/forecast-alerts`, cookie: scheduler, valid: { forecastAlerts: false }, textField: "forecastAlerts", limit: "1 KB" },
      { path: `/api/projects/${own.body.id}/daily-reforecast`, cookie: scheduler, valid: { dailyReforecastHour: null }, textField: "dailyReforecastHour", limit: "1 KB" },
      { path: `/api/projects/${own.body.id}/closure-weekly`, cookie: scheduler, valid: { closureWeeklyDay: null, closureWeeklyHour: null }, textField: "closureWeeklyDay", limit: "1 KB" },
    ];
  });

  it("a NUL character is 400 naming the field; nesting past 32 levels is 400 saying so; a body over the limit is 413 saying the limit", async () => {
    for (const r of routes) {
      const nul = await call(r.path, { method: "PUT", cookie: r.cookie, body: { ...r.valid, [r.textField]: "bad\u0000text" } });
      expect(nul.status, r.path).toBe(400);
      expect(nul.body.fields, r.path).toContainEqual(expect.objectContaining({ path: r.textField, message: "must not contain the NUL character (U+0000)" }));
      // 100 levels: deep enough to refuse, small enough to fit under the route's limit (a larger body is 413 first).
      const deep = await call(r.path, { method: "PUT", cookie: r.cookie, body: `{"x":${"[".repeat(100) + "]".repeat(100)}}` });
      expect(deep.status, r.path).toBe(400);
      expect(deep.body.fields, r.path).toEqual([{ path: "(body)", label: "Request body", message: "must not nest more than 32 levels" }]);
      const big = await call(r.path, { method: "PUT", cookie: r.cookie, body: { ...r.valid, pad: "p".repeat(70_000) } });
      expect(big.status, r.path).toBe(413);
      expect(big.body.error, r.path).toBe(`The request is larger than ${r.limit}; nothing was saved.`);
    }
  });
});

describe("every JSON route: NUL characters, deep nesting, oversize bodies", () => {
  let routes: { path: string; cookie: () => string; valid: Record<string, unknown>; textField: string }[];

  beforeAll(async () => {
    const s = await created("Body checks");
    const past = await createPastScenario(scheduler, projectId, "Body checks (field log)");
    const inspector = await signInAs("inspector");
    routes = [
      { path: `/api/projects/${projectId}/scenarios`, cookie: () => scheduler, valid: { name: "n", definition: base }, textField: "name" },
      { path: `/api/scenarios/${s.id}/variants`, cookie: () => scheduler, valid: { name: "n" }, textField: "name" },
      { path: `/api/scenarios/${s.id}/share-links`, cookie: () => scheduler, valid: { expiresInDays: 1, label: "l" }, textField: "label" },
      { path: `/api/searches/${await newSearch(s.id, scheduler)}/share-links`, cookie: () => scheduler, valid: { expiresInDays: 1, label: "l" }, textField: "label" },
      { path: `/api/scenarios/${s.id}/runs`, cookie: () => scheduler, valid: { seed: "s", iterations: 10 }, textField: "seed" },
      { path: `/api/scenarios/${s.id}/reforecast`, cookie: () => scheduler, valid: { dataDate: base.startDate, seed: "s", iterations: 10 }, textField: "seed" },
      { path: `/api/scenarios/${past.id}/progress`, cookie: () => inspector, valid: { workDate: isoDaysFromToday(-20), shift: "day", operationId: "milling", fromStationFt: 0, toStationFt: 100 }, textField: "crew" },
      { path: `/api/projects/${projectId}/closure-subscribers`, cookie: () => scheduler, valid: { email: "pio@marrin-county.example" }, textField: "label" },
      { path: `/api/projects/${projectId}/members`, cookie: () => admin, valid: { email: "nobody@marrin-dot.example", role: "viewer" }, textField: "email" },
    ];
  });

  it("a NUL character in a text field is 400 naming the field", async () => {
    for (const r of routes) {
      const res = await call(r.path, { method: "POST", cookie: r.cookie(), body: { ...r.valid, [r.textField]: "bad\u0000text" } });
      expect(res.status, r.path).toBe(400);
      expect(res.body.fields, r.path).toContainEqual(expect.objectContaining({ path: r.textField, message: "must not contain the NUL character (U+0000)" }));
    }
    // Inside a scenario definition too.
    const def = clone(base);
    def.operations[2].name = "Hydro\u0000demolition";
    const inDef = await save("NUL in definition", def);
    expect(inDef.status).toBe(400);
    expect(inDef.body.fields).toEqual([{ path: "definition.operations[2].name", label: "Operation 3 › Name", message: "must not contain the NUL character (U+0000)" }]);
  });

  it("10,000-level nesting is 400, not 500", async () => {
    const deep = "[".repeat(10_000) + "]".repeat(10_000);
    for (const r of routes) {
      const res = await call(r.path, { method: "POST", cookie: r.cookie(), body: `{"x":${deep}}` });
      expect(res.status, r.path).toBe(400);
      expect(res.body.fields, r.path).toEqual([{ path: "(body)", label: "Request body", message: "must not nest more than 32 levels" }]);
    }
  });

  it("a body over 1 MB is 413 with a plain message, with or without a Content-Length", async () => {
    for (const r of routes.filter((x) => !x.path.endsWith("/runs"))) {
      const res = await call(r.path, { method: "POST", cookie: r.cookie(), body: { ...r.valid, pad: "p".repeat(1_100_000) } });
      expect(res.status, r.path).toBe(413);
      expect(res.body.error, r.path).toBe("The request is larger than 1 MB; nothing was saved.");
    }
    const streamed = await postStreamed(routes[0].path, scheduler, 3 * 1024 * 1024);
    expect(streamed.status).toBe(413);
    expect(streamed.body.code).toBe("too_large");
  });
});
