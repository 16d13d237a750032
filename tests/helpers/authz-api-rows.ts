/**
 * The expectations table of the API authorization matrix: one row per "METHOD /api/path/[param]". A row says what
 * the route needs (a permission of src/lib/permissions.ts, any session, a token of some scope, or nothing) and
 * the answer when that need is met; `expectedStatus` derives every other cell from the role table, so no cell is
 * typed in by hand. `request` builds the call for one caller; rows that destroy something make a fresh victim.
 */
import { can, type Action } from "@/lib/permissions";
import { call, demoEmail, DEMO_PASSWORD, signIn, type DemoRole } from "./app";
import { isoDaysFromToday } from "./progress-fixture";
import {
  isRole,
  must,
  newAccount,
  newFieldScenario,
  newScenario,
  newShareLink,
  newSubscriber,
  millingShift,
  SMALL_SEARCH,
  tokenOf,
  uniq,
  unknownToken,
  type Caller,
  type World,
} from "./authz-world";
import { createPastScenario } from "./progress-fixture";

export type Need =
  | { kind: "public"; status: number }
  | { kind: "session" }
  | { kind: "project"; action: Action }
  | { kind: "scenario"; action: Action }
  | { kind: "token"; scopes: ("share" | "feed" | "search")[] };

export interface Prepared {
  params: Record<string, string>;
  query?: string;
  body?: unknown;
  /** Overrides the caller's usual cookie (a fresh session for sign-out, which would end the shared one). */
  cookie?: string;
  /** For destructive rows: is the victim still there? Must be false exactly when the call was allowed. */
  survives?: () => Promise<boolean>;
}

export interface ApiRow {
  need: Need;
  ok: number;
  request: (w: World, c: Caller) => Promise<Prepared>;
}

const signedIn = (c: Caller) => isRole(c) || c === "otherProjectAdmin";

/** The answer a caller must get, from the row's need and the role table. */
export function expectedStatus(row: ApiRow, c: Caller): number {
  const need = row.need;
  switch (need.kind) {
    case "public":
      return need.status;
    case "session":
      return signedIn(c) ? row.ok : 401;
    case "project":
    case "scenario":
      if (!signedIn(c)) return 401;
      if (!isRole(c)) return 404; // an administrator of another project is nobody here
      return can(c, need.action) ? row.ok : 403;
    case "token": {
      const scope = c === "shareLink" ? "share" : c === "feedToken" ? "feed" : c === "searchLink" ? "search" : null;
      return scope && need.scopes.includes(scope) ? row.ok : 404;
    }
  }
}

const proj = (w: World) => ({ projectId: w.projectId });
const scen = (w: World) => ({ scenarioId: w.target.id });
const admin = (w: World) => w.cookies.admin;

/** A brand-new session for a signed-in caller (sign-out must not end the session other cells share). */
async function freshSession(w: World, c: Caller): Promise<string | undefined> {
  if (!signedIn(c)) return undefined;
  const email = c === "otherProjectAdmin" ? w.strangerEmail : demoEmail(c as DemoRole);
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password: DEMO_PASSWORD } });
  must(res, 200, "fresh session");
  return res.headers.get("set-cookie")!.split(";")[0];
}

/** For a signed-in caller, the session of a new account of its own (the account routes change or end what they act on). */
async function throwawaySession(w: World, c: Caller): Promise<string | undefined> {
  if (!signedIn(c)) return undefined;
  return signIn((await newAccount(w.db, "own-account")).email);
}

async function listed(path: string, cookie: string, key: string, id: string): Promise<boolean> {
  const body = must(await call(path, { cookie }), 200, `list ${path}`);
  return (body[key] as { id?: string; userId?: string }[]).some((x) => (x.id ?? x.userId) === id);
}

function surveyForm(): FormData {
  const form = new FormData();
  form.set("kind", "survey");
  form.set("file", new Blob(["from_station,to_station,repair_share\n1200,1800,0.2\n1800,2400,0.05\n"], { type: "text/csv" }), "survey.csv");
  return form;
}

/** A field log of one shift as a CSV upload (the download's columns), for a scenario of its own. */
function shiftsForm(): FormData {
  const s = millingShift();
  const form = new FormData();
  form.set("file", new Blob([`work_date,shift,operation,station_from_ft,station_to_ft,crew\n${s.workDate},day,milling,0,300,M1\n`], { type: "text/csv" }), "field-log.csv");
  return form;
}

export const API_ROWS: Record<string, ApiRow> = {
  // ---- accounts: no permission, the same answer for everyone ----
  "POST /api/auth/signin": {
    need: { kind: "public", status: 200 },
    ok: 200,
    request: async (w) => ({ params: {}, body: { email: (await newAccount(w.db, "signin")).email, password: DEMO_PASSWORD } }),
  },
  "POST /api/auth/signout": { need: { kind: "public", status: 200 }, ok: 200, request: async (w, c) => ({ params: {}, cookie: await freshSession(w, c) }) },
  "GET /api/auth/session": { need: { kind: "session" }, ok: 200, request: async () => ({ params: {} }) },
  // Counted per client address (20 per 15 min): one request per caller, for an address nobody has.
  "POST /api/auth/password-reset": { need: { kind: "public", status: 200 }, ok: 200, request: async () => ({ params: {}, body: { email: `${uniq("nobody")}@authz.example` } }) },
  // A share or feed token is not a reset token: the caller's own token (or an unknown one) opens nothing.
  "POST /api/auth/password-reset/confirm": {
    need: { kind: "public", status: 404 },
    ok: 404,
    request: async (w, c) => ({ params: {}, body: { token: tokenOf(w, c) ?? unknownToken(), password: "a-brand-new-password" } }),
  },

  // ---- one's own account: each signed-in caller acts on a throwaway account of its own, so no shared session ends ----
  "PUT /api/account": {
    need: { kind: "session" },
    ok: 200,
    request: async (w, c) => ({ params: {}, cookie: await throwawaySession(w, c), body: { name: "Renamed in the matrix", title: "Tester" } }),
  },
  "PUT /api/account/password": {
    need: { kind: "session" },
    ok: 200,
    request: async (w, c) => ({ params: {}, cookie: await throwawaySession(w, c), body: { currentPassword: DEMO_PASSWORD, newPassword: "a-brand-new-password", confirm: "a-brand-new-password" } }),
  },
  "DELETE /api/account/sessions": { need: { kind: "session" }, ok: 200, request: async (w, c) => ({ params: {}, cookie: await throwawaySession(w, c) }) },

  // ---- projects ----
  "GET /api/projects": { need: { kind: "session" }, ok: 200, request: async () => ({ params: {} }) },
  // Anyone signed in may start a project (and becomes its administrator).
  "POST /api/projects": {
    need: { kind: "session" },
    ok: 201,
    request: async () => ({ params: {}, body: { name: uniq("matrix project"), structureName: "Matrix structure", deckLengthFt: 600, startStationFt: "3+00", lanes: "L1, L2" } }),
  },
  "GET /api/projects/[projectId]": { need: { kind: "project", action: "read" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  // Writes the project's own details back unchanged: other tests find the seeded project by its name.
  "PUT /api/projects/[projectId]": {
    need: { kind: "project", action: "editProject" },
    ok: 200,
    request: async (w) => {
      const p = must(await call(`/api/projects/${w.projectId}`, { cookie: admin(w) }), 200, "project").project;
      const body = { name: p.name, structureName: p.structureName, region: p.region, deckLengthFt: p.deckLengthFt, startStationFt: p.startStationFt, lanes: p.lanes, description: p.description };
      return { params: proj(w), body };
    },
  },
  // Sends "restore": allowed, it changes nothing on a project in use, so the other rows keep their project as it was
  // (archiving itself is tested in tests/integration/project-archive.test.ts).
  "PUT /api/projects/[projectId]/archive": {
    need: { kind: "project", action: "archiveProject" },
    ok: 200,
    request: async (w) => ({ params: proj(w), body: { archived: false } }),
  },
  // Sends the plan of record the project has: allowed, it changes nothing the other rows read.
  "PUT /api/projects/[projectId]/plan-of-record": {
    need: { kind: "project", action: "editProject" },
    ok: 200,
    request: async (w) => {
      const [row] = await w.db`SELECT plan_scenario_id FROM projects WHERE id = ${w.projectId}`;
      return { params: proj(w), body: { planScenarioId: row.plan_scenario_id } };
    },
  },
  // Sends the setting the project has: allowed, it changes nothing the other rows read.
  "PUT /api/projects/[projectId]/daily-reforecast": {
    need: { kind: "project", action: "editProject" },
    ok: 200,
    request: async (w) => {
      const [row] = await w.db`SELECT daily_reforecast_hour FROM projects WHERE id = ${w.projectId}`;
      return { params: proj(w), body: { dailyReforecastHour: row.daily_reforecast_hour } };
    },
  },
  // Sends "off", as every demo member has it: allowed for every role (a person's own inbox), it changes nothing others read.
  "PUT /api/projects/[projectId]/forecast-alerts": {
    need: { kind: "project", action: "read" },
    ok: 200,
    request: async (w) => ({ params: proj(w), body: { forecastAlerts: false } }),
  },
  "GET /api/projects/[projectId]/scenarios": { need: { kind: "project", action: "read" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  "POST /api/projects/[projectId]/scenarios": {
    need: { kind: "project", action: "editScenario" },
    ok: 201,
    request: async (w) => {
      const name = uniq("created");
      return { params: proj(w), body: { name, definition: { ...w.base, name } } };
    },
  },
  "GET /api/projects/[projectId]/compare": { need: { kind: "project", action: "read" }, ok: 200, request: async (w) => ({ params: proj(w), query: `ids=${w.target.id}` }) },
  "GET /api/projects/[projectId]/members": { need: { kind: "project", action: "read" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  "POST /api/projects/[projectId]/members": {
    need: { kind: "project", action: "manageMembers" },
    ok: 201,
    request: async (w) => ({ params: proj(w), body: { email: (await newAccount(w.db, "added")).email, role: "viewer" } }),
  },
  "DELETE /api/projects/[projectId]/members/[userId]": {
    need: { kind: "project", action: "manageMembers" },
    ok: 200,
    request: async (w) => {
      const victim = await newAccount(w.db, "removed");
      must(await call(`/api/projects/${w.projectId}/members`, { method: "POST", cookie: admin(w), body: { email: victim.email, role: "viewer" } }), 201, "member to remove");
      return { params: { ...proj(w), userId: victim.id }, survives: () => listed(`/api/projects/${w.projectId}/members`, admin(w), "members", victim.id) };
    },
  },
  "GET /api/projects/[projectId]/invitations": { need: { kind: "project", action: "manageMembers" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  "POST /api/projects/[projectId]/invitations": {
    need: { kind: "project", action: "manageMembers" },
    ok: 201,
    request: async (w) => ({ params: proj(w), body: { email: `${uniq("invitee")}@authz.example`, role: "viewer" } }),
  },
  "GET /api/projects/[projectId]/closure-weekly": { need: { kind: "project", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  // Sends the setting the project has: allowed, it changes nothing the other rows read.
  "PUT /api/projects/[projectId]/closure-weekly": {
    need: { kind: "project", action: "shareScenario" },
    ok: 200,
    request: async (w) => {
      const [row] = await w.db`SELECT closure_weekly_day, closure_weekly_hour FROM projects WHERE id = ${w.projectId}`;
      return { params: proj(w), body: { closureWeeklyDay: row.closure_weekly_day, closureWeeklyHour: row.closure_weekly_hour } };
    },
  },
  "GET /api/projects/[projectId]/closure-subscribers": { need: { kind: "project", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: proj(w) }) },
  "POST /api/projects/[projectId]/closure-subscribers": {
    need: { kind: "project", action: "shareScenario" },
    ok: 201,
    request: async (w) => ({ params: proj(w), body: { email: `${uniq("subscriber")}@authz.example`, label: "matrix" } }),
  },
  "DELETE /api/projects/[projectId]/closure-subscribers/[subscriberId]": {
    need: { kind: "project", action: "shareScenario" },
    ok: 200,
    request: async (w) => {
      const id = await newSubscriber(w.projectId, admin(w));
      return { params: { ...proj(w), subscriberId: id }, survives: () => listed(`/api/projects/${w.projectId}/closure-subscribers`, admin(w), "subscribers", id) };
    },
  },

  // ---- scenarios ----
  "GET /api/scenarios/[scenarioId]": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "PUT /api/scenarios/[scenarioId]": {
    need: { kind: "scenario", action: "editScenario" },
    ok: 200,
    request: async (w) => {
      const s = await newScenario(w, w.projectId, admin(w), "to update");
      return { params: { scenarioId: s.id }, body: { name: "updated", definition: { ...w.base, name: "updated" }, version: s.version } };
    },
  },
  "DELETE /api/scenarios/[scenarioId]": {
    need: { kind: "scenario", action: "editScenario" },
    ok: 200,
    request: async (w) => {
      const s = await newScenario(w, w.projectId, admin(w), "to delete");
      return { params: { scenarioId: s.id }, survives: async () => (await call(`/api/scenarios/${s.id}`, { cookie: admin(w) })).status === 200 };
    },
  },
  "POST /api/scenarios/[scenarioId]/variants": { need: { kind: "scenario", action: "editScenario" }, ok: 201, request: async (w) => ({ params: scen(w), body: { name: uniq("variant") } }) },
  "GET /api/scenarios/[scenarioId]/revisions": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w), query: "version=1" }) },
  "GET /api/scenarios/[scenarioId]/runs": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  // Without a summary a run is an engine job (202); the same computation asked again is the same job.
  "POST /api/scenarios/[scenarioId]/runs": { need: { kind: "scenario", action: "runScenario" }, ok: 202, request: async (w) => ({ params: scen(w), body: { seed: "matrix", iterations: 10 } }) },
  "GET /api/runs/[runId]": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { runId: w.runId } }) },
  "GET /api/scenarios/[scenarioId]/exports/results.csv": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "GET /api/scenarios/[scenarioId]/exports/closures.ics": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "GET /api/scenarios/[scenarioId]/exports/field-log.csv": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "GET /api/scenarios/[scenarioId]/uploads": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "POST /api/scenarios/[scenarioId]/uploads": { need: { kind: "scenario", action: "editScenario" }, ok: 201, request: async (w) => ({ params: scen(w), body: surveyForm() }) },

  // ---- engine jobs and plan searches ----
  "GET /api/jobs/[jobId]": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { jobId: w.jobId } }) },
  // A cancel needs runScenario and being the job's owner, or a project administrator. The admin starts each
  // victim, so for everyone else it is someone else's job: only an administrator may cancel it (the owner's
  // own cancel is in tests/integration/jobs.test.ts). A fresh job per caller, big enough to be still queued or
  // running when the cancel comes; whatever the answer, it is cancelled afterwards so no worker stays busy.
  "DELETE /api/jobs/[jobId]": {
    need: { kind: "scenario", action: "manageMembers" },
    ok: 200,
    request: async (w) => {
      const queued = must(await call(`/api/scenarios/${w.target.id}/runs`, { method: "POST", cookie: admin(w), body: { seed: uniq("cancel"), iterations: 2_000 } }), 202, "job to cancel");
      const path = `/api/jobs/${queued.job.id}`;
      return {
        params: { jobId: queued.job.id },
        survives: async () => {
          const alive = must(await call(path, { cookie: admin(w) }), 200, "job after cancel").job.status !== "cancelled";
          if (alive) await call(path, { method: "DELETE", cookie: admin(w) });
          return alive;
        },
      };
    },
  },
  "GET /api/scenarios/[scenarioId]/searches": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "POST /api/scenarios/[scenarioId]/searches": {
    need: { kind: "scenario", action: "runScenario" },
    ok: 202,
    request: async (w) => ({ params: scen(w), body: { name: uniq("search"), spec: SMALL_SEARCH } }),
  },
  "GET /api/searches/[searchId]": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { searchId: w.searchId } }) },
  // Saving a variant as a scenario is an ordinary scenario save (the variant's choice exists from the start).
  "POST /api/searches/[searchId]/scenarios": {
    need: { kind: "scenario", action: "editScenario" },
    ok: 201,
    request: async (w) => ({ params: { searchId: w.searchId }, body: { idx: 1, name: uniq("from search") } }),
  },
  // Making a variant the plan saves a new version of the searched scenario: a fresh scenario and search per call,
  // since each allowed call moves its scenario past the version the search varied.
  "POST /api/searches/[searchId]/adopt": {
    need: { kind: "scenario", action: "editScenario" },
    ok: 200,
    request: async (w) => {
      const s = await newScenario(w, w.projectId, admin(w), "to adopt into");
      const search = must(await call(`/api/scenarios/${s.id}/searches`, { method: "POST", cookie: admin(w), body: { name: uniq("adopt"), spec: SMALL_SEARCH } }), 202, "search");
      // Its variants exist from the start and using one needs no result: the engine is spared the work.
      must(await call(`/api/jobs/${search.job.id}`, { method: "DELETE", cookie: admin(w) }), 200, "cancel");
      // Variant 2 works through holidays: a change to the demo plan, which stands down (variant 1 is the plan as it is).
      return { params: { searchId: search.search.id }, body: { idx: 2 } };
    },
  },

  // ---- sharing ----
  // The week ahead: every member reads the board; the daily notice is a sharing act; the location belongs to
  // the project's administrator and engineer. The location is written back unchanged (the seeded demo point).
  "GET /api/scenarios/[scenarioId]/look-ahead": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "GET /api/scenarios/[scenarioId]/look-ahead/notice": { need: { kind: "scenario", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "PUT /api/scenarios/[scenarioId]/look-ahead/notice": {
    need: { kind: "scenario", action: "shareScenario" },
    ok: 200,
    request: async (w) => ({ params: scen(w), body: { enabled: false, hour: 6, recipients: ["field-team@marrin-dot.example"] } }),
  },
  "PUT /api/projects/[projectId]/location": {
    need: { kind: "project", action: "editProject" },
    ok: 200,
    request: async (w) => ({ params: proj(w), body: { latitude: 30.25, longitude: -88.1 } }),
  },
  "GET /api/scenarios/[scenarioId]/share-links": { need: { kind: "scenario", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: scen(w) }) },
  "POST /api/scenarios/[scenarioId]/share-links": { need: { kind: "scenario", action: "shareScenario" }, ok: 201, request: async (w) => ({ params: scen(w), body: { expiresInDays: 7 } }) },
  "DELETE /api/share-links/[linkId]": {
    need: { kind: "scenario", action: "shareScenario" },
    ok: 200,
    request: async (w) => {
      const link = await newShareLink(w.target.id, admin(w));
      return { params: { linkId: link.id }, survives: async () => (await call(`/api/shared/${link.token}`)).status === 200 };
    },
  },
  // Links to one plan search: whoever may share the scenario may share its searches (revoked like any link, above).
  "GET /api/searches/[searchId]/share-links": { need: { kind: "scenario", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: { searchId: w.searchId } }) },
  "POST /api/searches/[searchId]/share-links": {
    need: { kind: "scenario", action: "shareScenario" },
    ok: 201,
    request: async (w) => ({ params: { searchId: w.searchId }, body: { expiresInDays: 7, label: uniq("search link") } }),
  },
  // The list of publications and, with ?preview=1, what publishing would send (sends nothing): one handler and
  // one permission check, exercised here on the preview (it also reads the run publishing would name).
  "GET /api/scenarios/[scenarioId]/closure-publications": { need: { kind: "scenario", action: "shareScenario" }, ok: 200, request: async (w) => ({ params: scen(w), query: "preview=1" }) },
  "POST /api/scenarios/[scenarioId]/closure-publications": { need: { kind: "scenario", action: "shareScenario" }, ok: 201, request: async (w) => ({ params: scen(w) }) },
  // The token in the path is the only credential: a share link opens the shared view, a calendar-feed token only the feed.
  // A search link opens its search's JSON and nothing else; no other token opens a search.
  "GET /api/shared-search/[token]": { need: { kind: "token", scopes: ["search"] }, ok: 200, request: async (w, c) => ({ params: { token: tokenOf(w, c) ?? unknownToken() } }) },
  "GET /api/shared/[token]": { need: { kind: "token", scopes: ["share"] }, ok: 200, request: async (w, c) => ({ params: { token: tokenOf(w, c) ?? unknownToken() } }) },
  "GET /api/shared/[token]/closures.ics": {
    need: { kind: "token", scopes: ["share", "feed"] },
    ok: 200,
    request: async (w, c) => ({ params: { token: tokenOf(w, c) ?? unknownToken() } }),
  },

  // ---- field log (the inspector's permission) ----
  "GET /api/scenarios/[scenarioId]/progress": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { scenarioId: w.field.id } }) },
  "POST /api/scenarios/[scenarioId]/progress": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 201,
    request: async (w) => ({ params: { scenarioId: (await createPastScenario(admin(w), w.projectId, uniq("field log"))).id }, body: millingShift() }),
  },
  "POST /api/scenarios/[scenarioId]/progress/import": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 201,
    request: async (w) => ({ params: { scenarioId: (await createPastScenario(admin(w), w.projectId, uniq("field log file"))).id }, body: shiftsForm() }),
  },
  "POST /api/scenarios/[scenarioId]/progress/import/check": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 200,
    request: async (w) => ({ params: { scenarioId: (await createPastScenario(admin(w), w.projectId, uniq("field log file checked"))).id }, body: shiftsForm() }),
  },
  "GET /api/progress/[entryId]": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { entryId: w.field.entryId } }) },
  "PUT /api/progress/[entryId]": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 200,
    request: async (w) => {
      const f = await newFieldScenario(w.projectId, admin(w));
      return { params: { entryId: f.entryId }, body: { ...millingShift({ toStationFt: 350 }), version: f.entryVersion } };
    },
  },
  "DELETE /api/progress/[entryId]": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 200,
    request: async (w) => {
      const f = await newFieldScenario(w.projectId, admin(w));
      return { params: { entryId: f.entryId }, survives: async () => (await call(`/api/progress/${f.entryId}`, { cookie: admin(w) })).status === 200 };
    },
  },
  "POST /api/progress/[entryId]/restore": {
    need: { kind: "scenario", action: "recordProgress" },
    ok: 200,
    request: async (w) => {
      const f = await newFieldScenario(w.projectId, admin(w));
      must(await call(`/api/progress/${f.entryId}`, { method: "DELETE", cookie: admin(w) }), 200, "deleting the entry to put back");
      // Refused: the entry stays deleted (not readable in the log).
      return { params: { entryId: f.entryId }, survives: async () => (await call(`/api/progress/${f.entryId}`, { cookie: admin(w) })).status === 404 };
    },
  },
  "GET /api/scenarios/[scenarioId]/reforecast": { need: { kind: "scenario", action: "read" }, ok: 200, request: async (w) => ({ params: { scenarioId: w.field.id } }) },
  "POST /api/scenarios/[scenarioId]/reforecast": {
    need: { kind: "scenario", action: "runScenario" },
    ok: 202,
    request: async (w) => ({ params: { scenarioId: w.field.id }, body: { dataDate: isoDaysFromToday(-1), seed: "matrix", iterations: 10 } }),
  },
};
