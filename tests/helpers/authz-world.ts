/**
 * The world the authorization tests run in: the five demo roles on the Kestrel project, a stranger who is the
 * administrator of a project of their own (and no member of Kestrel), a share link, a closure-calendar feed
 * token and a plan search's share link, plus resources on the stranger's project and on the seeded Tern Point project to use as foreign ids.
 * Everything is made through the API as a real user would, except the stranger's account and project: there is
 * no route that creates a project, so those two rows are written straight into the app's database.
 */
import postgres from "postgres";
import { randomBytes, randomUUID } from "node:crypto";
import { call, demoDefinition, kestrelProject, signIn, signInAs, DEMO_PASSWORD, type CallOptions, type DemoRole, type Reply } from "./app";
import { createPastScenario, isoDaysFromToday } from "./progress-fixture";
import { waitForJob } from "./jobs";
import { forgetRecentMail } from "./mail-quota";
import { hashPassword } from "../../src/lib/server/password";

export const ROLES: DemoRole[] = ["admin", "engineer", "scheduler", "inspector", "viewer"];
export type Caller = DemoRole | "signedOut" | "otherProjectAdmin" | "shareLink" | "feedToken" | "searchLink";
export const CALLERS: Caller[] = [...ROLES, "signedOut", "otherProjectAdmin", "shareLink", "feedToken", "searchLink"];
export const isRole = (c: Caller): c is DemoRole => (ROLES as string[]).includes(c);
export const isTokenHolder = (c: Caller): c is "shareLink" | "feedToken" | "searchLink" => c === "shareLink" || c === "feedToken" || c === "searchLink";

/** A scenario, with what a caller needs to address it. */
export interface Ref {
  id: string;
  version: number;
}

export interface World {
  db: postgres.Sql;
  projectId: string;
  ternProjectId: string;
  strangerProjectId: string;
  strangerEmail: string;
  strangerUserId: string;
  base: Record<string, unknown>;
  /** A Kestrel scenario with a current server run (and its engine job), a plan search, a share link, a published closure feed and a link to the search. */
  target: Ref;
  runId: string;
  jobId: string;
  searchId: string;
  shareToken: string;
  feedToken: string;
  /** A share link to `searchId` (scope "search"): it opens that search only. */
  searchToken: string;
  /** A Kestrel past-dated scenario with one progress entry (the field log needs dates that are not in the future). */
  field: Ref & { entryId: string };
  cookies: Record<DemoRole | "otherProjectAdmin", string>;
  /** Ids that belong to the stranger's project. */
  stranger: { scenarioId: string; runId: string; jobId: string; searchId: string; entryId: string; shareLinkId: string; subscriberId: string };
  /** Ids on the Tern Point project, of which the demo admin is also the administrator. */
  tern: { scenarioId: string; subscriberId: string; shareLinkId: string };
}

export const uniq = (label: string) => `${label}-${randomUUID().slice(0, 8)}`;
const cheapPasswordHash = hashPassword(DEMO_PASSWORD);

/** A real account (not a member of anything), with the demo password. */
export async function newAccount(db: postgres.Sql, label: string): Promise<{ id: string; email: string }> {
  const id = randomUUID();
  const email = `${uniq(label)}@authz.example`;
  await db`INSERT INTO users (id, email, name, password_hash) VALUES (${id}, ${email}, ${`Test ${label}`}, ${await cheapPasswordHash})`;
  return { id, email };
}

export function must(res: Reply, status: number, what: string): any {
  if (res.status !== status) throw new Error(`fixture "${what}" answered ${res.status}: ${JSON.stringify(res.body)?.slice(0, 300)}`);
  return res.body;
}

export async function newScenario(w: Pick<World, "base">, projectId: string, cookie: string, label = "matrix"): Promise<Ref> {
  const name = uniq(label);
  return must(await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name, definition: { ...w.base, name } } }), 201, "scenario");
}

/** A run an engine worker computes (202 with its job), waited for: the stored run's id and the job's. */
export async function serverRun(scenarioId: string, cookie: string): Promise<{ runId: string; jobId: string }> {
  const queued = must(await call(`/api/scenarios/${scenarioId}/runs`, { method: "POST", cookie, body: { seed: "matrix", iterations: 10 } }), 202, "run");
  const job = await waitForJob(queued.job.id, cookie);
  if (job.status !== "completed" || !job.runId) throw new Error(`fixture run ${job.status}: ${job.error}`);
  return { runId: job.runId, jobId: job.id };
}

/** The smallest plan search: the plan as saved and two variants, 100 iterations each (not waited for). */
export const SMALL_SEARCH = { dimensions: [{ kind: "holidayPolicy", values: ["standDown", "workThrough"] }], maxVariants: 4, iterations: 100, seed: "matrix" };

export async function newSearch(scenarioId: string, cookie: string): Promise<string> {
  return must(await call(`/api/scenarios/${scenarioId}/searches`, { method: "POST", cookie, body: { name: uniq("search"), spec: SMALL_SEARCH } }), 202, "search").search.id;
}

export async function newShareLink(scenarioId: string, cookie: string): Promise<{ id: string; token: string }> {
  return must(await call(`/api/scenarios/${scenarioId}/share-links`, { method: "POST", cookie, body: { expiresInDays: 7, label: "matrix" } }), 201, "share link");
}

export async function newSearchLink(searchId: string, cookie: string): Promise<{ id: string; token: string; path: string }> {
  return must(await call(`/api/searches/${searchId}/share-links`, { method: "POST", cookie, body: { expiresInDays: 7, label: "matrix search" } }), 201, "search link");
}

export async function newSubscriber(projectId: string, cookie: string): Promise<string> {
  const email = `${uniq("sub")}@authz.example`;
  must(await call(`/api/projects/${projectId}/closure-subscribers`, { method: "POST", cookie, body: { email, label: "matrix" } }), 201, "subscriber");
  const list = must(await call(`/api/projects/${projectId}/closure-subscribers`, { cookie }), 200, "subscriber list");
  return list.subscribers.find((s: { email: string }) => s.email === email).id;
}

/** The first fixture day's milling shift on a past-dated scenario (see tests/helpers/progress-fixture.ts). */
export const millingShift = (over: Record<string, unknown> = {}) => ({
  workDate: isoDaysFromToday(-20),
  shift: "day",
  operationId: "milling",
  fromStationFt: 0,
  toStationFt: 300,
  crew: "M1",
  tempF: 55,
  ...over,
});

export async function newFieldScenario(projectId: string, cookie: string): Promise<Ref & { entryId: string; entryVersion: number }> {
  const s = await createPastScenario(cookie, projectId, uniq("field"));
  const entry = must(await call(`/api/scenarios/${s.id}/progress`, { method: "POST", cookie, body: millingShift() }), 201, "progress entry");
  return { id: s.id, version: s.version, entryId: entry.id, entryVersion: entry.version ?? 1 };
}

/**
 * `ownCopy`: the world is built on a copy of the Kestrel project (its details and its five members) instead of
 * Kestrel itself — for a file that changes the project as a whole (archiving it), which must not refuse the
 * writes of the browser tests that run beside the integration files on the real Kestrel project.
 */
export async function buildWorld(options: { ownCopy?: boolean } = {}): Promise<World> {
  const db = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
  const cookies = {} as World["cookies"];
  for (const r of ROLES) cookies[r] = await signInAs(r);
  const admin = cookies.admin;
  const kestrelId = (await kestrelProject(admin)).id;
  const projectId = options.ownCopy ? await copyOfProject(db, kestrelId) : kestrelId;
  const projects = must(await call("/api/projects", { cookie: admin }), 200, "projects").projects as { id: string; name: string }[];
  const ternProjectId = projects.find((p) => p.name.includes("Tern"))!.id;
  const base = await demoDefinition(admin, kestrelId);
  await forgetRecentMail(projectId);

  // The stranger: administrator of a project of their own, never a member of Kestrel.
  const stranger = await newAccount(db, "stranger");
  const [{ id: strangerProjectId }] = await db`
    INSERT INTO projects (name, structure_name, region, deck_length_ft, start_station_ft, lanes, description)
    VALUES ('Osprey Creek Culvert — authorization test', 'Osprey Creek Culvert', 'Marrin County', 8400, 1200, ${db.json(["L1", "L2", "L3"])}, 'A project of someone else.')
    RETURNING id`;
  await db`INSERT INTO project_members (project_id, user_id, role) VALUES (${strangerProjectId}, ${stranger.id}, 'admin')`;
  cookies.otherProjectAdmin = await signIn(stranger.email);
  const sc = cookies.otherProjectAdmin;

  const target = await newScenario({ base }, projectId, admin, "matrix target");
  const { runId, jobId } = await serverRun(target.id, admin);
  const searchId = await newSearch(target.id, admin);
  const shareToken = (await newShareLink(target.id, admin)).token;
  const published = must(await call(`/api/scenarios/${target.id}/closure-publications`, { method: "POST", cookie: admin }), 201, "closure publication");
  const feedToken = new URL(published.feedUrl).pathname.split("/").at(-2)!;
  const searchToken = (await newSearchLink(searchId, admin)).token;
  const field = await newFieldScenario(projectId, admin);

  const sScenario = await newScenario({ base }, strangerProjectId, sc, "stranger's");
  const sField = await newFieldScenario(strangerProjectId, sc);
  const strangerRun = await serverRun(sScenario.id, sc);
  const strangerIds = {
    scenarioId: sScenario.id,
    runId: strangerRun.runId,
    jobId: strangerRun.jobId,
    searchId: await newSearch(sScenario.id, sc),
    entryId: sField.entryId,
    shareLinkId: (await newShareLink(sScenario.id, sc)).id,
    subscriberId: await newSubscriber(strangerProjectId, sc),
  };
  const tScenario = await newScenario({ base }, ternProjectId, admin, "tern");
  const tern = { scenarioId: tScenario.id, subscriberId: await newSubscriber(ternProjectId, admin), shareLinkId: (await newShareLink(tScenario.id, admin)).id };

  return {
    db,
    projectId,
    ternProjectId,
    strangerProjectId,
    strangerEmail: stranger.email,
    strangerUserId: stranger.id,
    base,
    target,
    runId,
    jobId,
    searchId,
    shareToken,
    feedToken,
    searchToken,
    field,
    cookies,
    stranger: strangerIds,
    tern,
  };
}

/** A new project with another project's details and members (written straight into the database: no route copies a project). */
async function copyOfProject(db: postgres.Sql, fromId: string): Promise<string> {
  return db.begin(async (tx) => {
    const [{ id }] = await tx`
      INSERT INTO projects (name, structure_name, region, deck_length_ft, start_station_ft, lanes, description, latitude, longitude)
      SELECT ${uniq("Kestrel copy")}, structure_name, region, deck_length_ft, start_station_ft, lanes, description, latitude, longitude
      FROM projects WHERE id = ${fromId}
      RETURNING id`;
    await tx`INSERT INTO project_members (project_id, user_id, role) SELECT ${id}, user_id, role FROM project_members WHERE project_id = ${fromId}`;
    return id as string;
  });
}

/** A well-formed token that was never issued. */
export const unknownToken = () => randomBytes(32).toString("base64url");

/** The token a caller holds, if any. */
export function tokenOf(w: World, c: Caller): string | null {
  return c === "shareLink" ? w.shareToken : c === "feedToken" ? w.feedToken : c === "searchLink" ? w.searchToken : null;
}

/**
 * How a caller presents itself. A session holder sends its cookie; a token holder tries its token every way a
 * client might — as a bearer token, as the session cookie, as a cookie of its own name and as a query parameter —
 * so a route that honoured any of them would be caught.
 */
export function present(w: World, c: Caller, path: string, opts: CallOptions = {}): [string, CallOptions] {
  if (c === "signedOut") return [path, { ...opts, cookie: opts.cookie ?? null }];
  const token = tokenOf(w, c);
  if (token) {
    const sep = path.includes("?") ? "&" : "?";
    return [
      `${path}${sep}token=${encodeURIComponent(token)}`,
      { ...opts, cookie: `pourline_session=${token}; pourline_share=${token}`, headers: { ...opts.headers, authorization: `Bearer ${token}` } },
    ];
  }
  return [path, { ...opts, cookie: opts.cookie ?? w.cookies[c as DemoRole | "otherProjectAdmin"] }];
}
