/**
 * `npm run bench -- --api [--json] [--seconds N] [--connections N]`: the read API under a team's load. Starts the
 * app the way `npm test` does (scripts/pourline.mjs: throwaway PostgreSQL cluster, migrate, seed the demo,
 * build if needed, serve on a free loopback port; no engine worker — nothing here computes), signs in as a
 * seeded demo member and loads two routes with autocannon for 20 s at 50 connections in all, half on each:
 *   - the scenario list of the demo project (what the project page's table reads), and
 *   - the latest run of the main demo scenario with its full results (what the charts read).
 * Requests carry a browser's Accept-Encoding and no validator, so every answer is a full 200 (a browser that
 * already holds the run gets a 304 instead; that is measured apart as `revalidate`). Latency percentiles are
 * nearest-rank over every response. The load tool runs on the same machine as the app and its database.
 * Everything started is stopped and the cluster removed on exit, Ctrl-C and failure included.
 */
import autocannon from "autocannon";
import { loadavg } from "node:os";
import demoUsers from "../db/demo-users.json";
import { failureMessage, logToStderr, shutdown, startThrowawayApp } from "./pourline.mjs";

const ACCEPT_ENCODING = "gzip, deflate, br, zstd"; // what Chromium sends
const MEMBER = demoUsers.find((u) => u.role === "scheduler")!;

interface Route {
  name: "list" | "results";
  path: string;
}

interface RouteFigures {
  requests: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  errors: number;
  bodyBytes: number;
}

/** Nearest-rank percentile of sorted latencies (ms), to 0.1 ms. */
function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return Math.round(sorted[Math.max(0, Math.ceil(p * sorted.length) - 1)] * 10) / 10;
}

function figures(latencies: number[], errors: number, bodyBytes: number): RouteFigures {
  const sorted = Float64Array.from(latencies).sort() as unknown as number[];
  return { requests: latencies.length, p50Ms: percentile(sorted, 0.5), p95Ms: percentile(sorted, 0.95), p99Ms: percentile(sorted, 0.99), errors, bodyBytes };
}

async function signIn(appUrl: string): Promise<string> {
  const res = await fetch(`${appUrl}/api/auth/signin`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify({ email: MEMBER.email, password: MEMBER.password }),
  });
  if (res.status !== 200) throw new Error(`signing in as the demo ${MEMBER.role} failed: ${res.status}`);
  return (res.headers.get("set-cookie") ?? "").split(";")[0];
}

async function getJson(appUrl: string, path: string, cookie: string) {
  const res = await fetch(`${appUrl}${path}`, { headers: { cookie } });
  if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}`);
  return res.json();
}

/** The list of the demo project and the forecast run of its main scenario, found as the pages find them. */
async function findRoutes(appUrl: string, cookie: string): Promise<Route[]> {
  const { projects } = await getJson(appUrl, "/api/projects", cookie);
  const project = projects.find((p: { name: string }) => p.name.includes("Kestrel"));
  if (!project) throw new Error("the seeded Kestrel project is missing");
  const listPath = `/api/projects/${project.id}/scenarios`;
  const { scenarios } = await getJson(appUrl, listPath, cookie);
  const main = scenarios.find((s: { name: string; runId: string | null }) => s.name.startsWith("Kestrel Bay Causeway") && s.runId);
  if (!main) throw new Error("no seeded demo scenario with a run");
  return [
    { name: "list", path: listPath },
    { name: "results", path: `/api/runs/${main.runId}` },
  ];
}

/** One autocannon instance per route, run together; every response's latency kept for exact percentiles. */
async function load(appUrl: string, cookie: string, routes: Route[], connections: number, seconds: number, extraHeaders: Record<string, string> = {}) {
  const per = Math.max(1, Math.floor(connections / routes.length));
  const runs = routes.map((route) => {
    const latencies: number[] = [];
    let bytes = 0;
    return new Promise<{ route: Route; latencies: number[]; bytes: number; result: autocannon.Result }>((resolve, reject) => {
      const options = { url: `${appUrl}${route.path}`, connections: per, duration: seconds, headers: { cookie, "accept-encoding": ACCEPT_ENCODING, ...extraHeaders } };
      const instance = autocannon(options, (err, result) => (err ? reject(err) : resolve({ route, latencies, bytes, result })));
      instance.on("response", (_client, _status, resBytes, ms) => {
        latencies.push(ms);
        bytes += resBytes;
      });
    });
  });
  const done = await Promise.all(runs);
  const byRoute: Record<string, RouteFigures & { status: Record<string, number> }> = {};
  for (const { route, latencies, bytes, result } of done) {
    const expected = extraHeaders["if-none-match"] ? "304" : "200";
    const status = Object.fromEntries(Object.entries(result.statusCodeStats ?? {}).map(([code, s]) => [code, s.count ?? 0]));
    const unexpected = Object.entries(status).reduce((n, [code, count]) => (code === expected ? n : n + count), 0);
    byRoute[route.name] = { ...figures(latencies, result.errors + unexpected, latencies.length ? Math.round(bytes / latencies.length) : 0), status };
  }
  const all = figures(done.flatMap((d) => d.latencies), Object.values(byRoute).reduce((n, r) => n + r.errors, 0), 0);
  return { connections: per * routes.length, seconds, all, byRoute };
}

async function etagOf(appUrl: string, path: string, cookie: string): Promise<string> {
  const res = await fetch(`${appUrl}${path}`, { headers: { cookie } });
  await res.arrayBuffer();
  return res.headers.get("etag") ?? "";
}

export async function benchApi(json: boolean, { seconds = 20, connections = 50 } = {}) {
  if (json) logToStderr();
  const note = (msg: string) => process.stderr.write(`[bench] ${msg}\n`);
  try {
    const { env } = await startThrowawayApp({ chromium: false, worker: false, quietApp: true });
    const appUrl = env.APP_URL;
    const cookie = await signIn(appUrl);
    const routes = await findRoutes(appUrl, cookie);
    note(`warming up (${routes.map((r) => r.path).join(", ")}) …`);
    await load(appUrl, cookie, routes, 10, 3);
    const loadBefore = loadavg().map((l) => Math.round(l * 100) / 100);
    note(`measuring: ${connections} connections, ${seconds} s …`);
    const full = await load(appUrl, cookie, routes, connections, seconds);
    // A browser that already holds this run sends its ETag back; a server without validators answers 200 again.
    const results = routes.find((r) => r.name === "results")!;
    const etag = await etagOf(appUrl, results.path, cookie);
    const revalidate = etag ? await load(appUrl, cookie, [results], connections, Math.max(1, Math.round(seconds / 4)), { "if-none-match": etag }) : null;
    const out = {
      api: {
        connections: full.connections,
        p50Ms: full.all.p50Ms,
        p95Ms: full.all.p95Ms,
        p99Ms: full.all.p99Ms,
        errors: full.all.errors,
        seconds,
        requests: full.all.requests,
        routes: Object.fromEntries(routes.map((r) => [r.name, { path: r.path, ...full.byRoute[r.name] }])),
        revalidate: revalidate ? { route: "results", ...revalidate.byRoute.results } : null,
        loadAverageBefore: loadBefore,
      },
    };
    if (json) console.log(JSON.stringify(out, null, 2));
    else {
      console.log(`read API, ${full.connections} connections for ${seconds} s (load average before: ${loadBefore.join(" ")})`);
      for (const r of routes) {
        const f = full.byRoute[r.name];
        console.log(`  ${r.name.padEnd(8)} ${String(f.requests).padStart(6)} requests  p50 ${f.p50Ms} ms  p95 ${f.p95Ms} ms  p99 ${f.p99Ms} ms  errors ${f.errors}  ~${f.bodyBytes} bytes each  ${r.path}`);
      }
      console.log(`  all      p50 ${full.all.p50Ms} ms  p95 ${full.all.p95Ms} ms (target ≤ 100)  p99 ${full.all.p99Ms} ms  errors ${full.all.errors}`);
      if (revalidate) {
        const f = revalidate.byRoute.results;
        console.log(`  results with If-None-Match: p50 ${f.p50Ms} ms  p95 ${f.p95Ms} ms  p99 ${f.p99Ms} ms  non-304 or errors ${f.errors}`);
      } else console.log("  results carry no ETag: nothing to revalidate");
    }
    await shutdown(0);
  } catch (e) {
    const cause = e instanceof Error && e.cause ? ` (${String((e.cause as Error).message ?? e.cause)})` : "";
    process.stderr.write(`[bench] ${failureMessage(e)}${cause}\n`);
    await shutdown(1);
  }
}
