/**
 * Talking to the running test app over HTTP, as a browser would: a session cookie per user and the
 * app's own Origin on every request.
 */
import demoUsers from "../../db/demo-users.json";

export const APP_URL = process.env.APP_URL ?? "";
if (!APP_URL) throw new Error("APP_URL is not set: run these tests through `npm test`, which starts the app.");

export type DemoRole = "admin" | "engineer" | "scheduler" | "inspector" | "viewer";
export const DEMO_PASSWORD = demoUsers[0].password;
export const demoEmail = (role: DemoRole) => demoUsers.find((u) => u.role === role)!.email;

export interface Reply {
  status: number;
  body: any;
  headers: Headers;
}

export interface CallOptions {
  method?: string;
  /** JSON (encoded here), a string sent as is, or a FormData sent as multipart. */
  body?: unknown;
  cookie?: string | null;
  origin?: string | null;
  /** Extra request headers (e.g. an Authorization header a token holder might try). */
  headers?: Record<string, string>;
}

export async function call(path: string, opts: CallOptions = {}): Promise<Reply> {
  const headers: Record<string, string> = { ...opts.headers };
  const isForm = opts.body instanceof FormData;
  if (opts.body !== undefined && !isForm) headers["content-type"] ??= "application/json";
  if (opts.cookie) headers.cookie = opts.cookie;
  if (opts.origin !== null) headers.origin = opts.origin ?? APP_URL;
  const res = await fetch(`${APP_URL}${path}`, {
    method: opts.method ?? "GET",
    headers,
    body: opts.body === undefined ? undefined : isForm || typeof opts.body === "string" ? (opts.body as BodyInit) : JSON.stringify(opts.body),
    redirect: "manual",
  });
  const text = await res.text();
  let body: any = text;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {}
  return { status: res.status, body, headers: res.headers };
}

const cookies = new Map<string, string>();

/** Signs in through the API and returns the session cookie (cached per e-mail for the test run). */
export async function signIn(email: string, password = DEMO_PASSWORD): Promise<string> {
  const cached = cookies.get(email);
  if (cached) return cached;
  const res = await call("/api/auth/signin", { method: "POST", body: { email, password } });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  const setCookie = res.headers.get("set-cookie") ?? "";
  const cookie = setCookie.split(";")[0];
  cookies.set(email, cookie);
  return cookie;
}

export const signInAs = (role: DemoRole) => signIn(demoEmail(role));

export async function kestrelProject(cookie: string): Promise<{ id: string }> {
  const res = await call("/api/projects", { cookie });
  const p = res.body.projects.find((x: { name: string }) => x.name.includes("Kestrel Bay Causeway — deck overlay"));
  if (!p) throw new Error("the seeded Kestrel project is missing");
  return p;
}

/**
 * A fresh variant of the seeded main demo ("Kestrel Bay Causeway — two seasons"), made by `cookie`'s member, so
 * a test edits or runs its own copy; returns its id.
 */
export async function mainDemoVariant(cookie: string, name: string): Promise<string> {
  const project = await kestrelProject(cookie);
  const list = await call(`/api/projects/${project.id}/scenarios`, { cookie });
  const main = list.body.scenarios.find((s: { name: string }) => s.name === "Kestrel Bay Causeway — two seasons");
  if (!main) throw new Error("the seeded main demo scenario (two seasons) is missing");
  const res = await call(`/api/scenarios/${main.id}/variants`, { method: "POST", cookie, body: { name } });
  if (res.status !== 201) throw new Error(`making the variant "${name}" answered ${res.status}`);
  return res.body.id;
}

/** The definition of a seeded demo scenario (other tests add scenarios of their own to the same project). */
export async function demoDefinition(cookie: string, projectId: string): Promise<Record<string, any>> {
  const list = await call(`/api/projects/${projectId}/scenarios`, { cookie });
  const demo = list.body.scenarios.find((s: { name: string }) => s.name.startsWith("Kestrel Bay Causeway"));
  if (!demo) throw new Error("no seeded demo scenario on the project");
  return (await call(`/api/scenarios/${demo.id}`, { cookie })).body.scenario.definition;
}
