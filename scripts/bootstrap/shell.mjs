// Shared by the bootstrap (scripts/pourline.mjs) and its parts: where progress goes, failing with a message for a
// person, running a program (as the postgres user when we are root), free loopback ports. Plain Node.
import { spawnSync } from "node:child_process";
import { connect, createServer } from "node:net";
import { dirname, resolve } from "node:path";
import { fileURLToPath } from "node:url";

export const root = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");
export const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
// Where progress lines and the children's output go: stdout, or stderr when a caller keeps stdout for its own
// result (a benchmark's --json).
let out = process.stdout;
let inheritStdio = "inherit";

export function logToStderr() {
  out = process.stderr;
  inheritStdio = ["inherit", 2, 2];
}

/** The stream progress goes to, and the stdio a child inherits (both follow `logToStderr`). */
export const progressStream = () => out;
export const childStdio = () => inheritStdio;

export function say(msg) {
  out.write(`[pourline] ${msg}\n`);
}

export class Fatal extends Error {}
export function fail(msg) {
  throw new Fatal(msg);
}

export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: opts.quiet ? "pipe" : inheritStdio, cwd: root, env: opts.env ?? process.env, encoding: "utf8" });
  if (r.error) fail(`${opts.what ?? cmd} could not start: ${r.error.message}`);
  if (r.status !== 0 && !opts.allowFail) {
    const detail = opts.quiet ? `\n${(r.stderr || r.stdout || "").trim().split("\n").slice(-15).join("\n")}` : "";
    fail(`${opts.what ?? `${cmd} ${args.join(" ")}`} failed (exit ${r.status}).${detail}`);
  }
  return r;
}

export function asPostgres(cmd, args, opts = {}) {
  return isRoot ? run("runuser", ["-u", "postgres", "--", cmd, ...args], opts) : run(cmd, args, opts);
}

// Loopback ports.
export function portFree(port) {
  return new Promise((res) => {
    const srv = createServer();
    srv.once("error", () => res(false));
    srv.listen(port, "127.0.0.1", () => srv.close(() => res(true)));
  });
}

/**
 * Whether something accepts connections on 127.0.0.1:`port`. Readiness is probed by connecting, never by
 * binding: a bind probe (portFree) holds the port for a moment, and a child binding it in that moment fails
 * with EADDRINUSE (it happened: the weather-service fake of a test run lost its port to its own readiness probe).
 */
export function portListening(port) {
  return new Promise((res) => {
    const socket = connect({ port, host: "127.0.0.1" });
    socket.once("connect", () => {
      socket.destroy();
      res(true);
    });
    socket.once("error", () => res(false));
  });
}

/** Waits up to `ms` for a child to listen on `port`; says whether it does. */
export async function untilListening(port, ms = 30_000) {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (await portListening(port)) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return false;
}

export async function freePort(from) {
  for (let p = from; p < from + 400; p++) if (await portFree(p)) return p;
  fail(`no free port found from ${from}`);
}
