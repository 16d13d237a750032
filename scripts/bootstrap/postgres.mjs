// PostgreSQL on loopback for the two commands: the data folder (in the clone, or one the postgres user can
// reach), start and stop, the databases and the app's own role (scripts/app-db-role.mjs).
import { createHash } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { ensureAppRole as ensureAppRoleWith } from "../app-db-role.mjs";
import { asPostgres, fail, isRoot, portFree, root, run, say } from "./shell.mjs";

export function dataFolderFor(kind) {
  if (kind === "test") {
    const dir = mkdtempSync(join(tmpdir(), "pourline-test-pg-"));
    chmodSync(dir, 0o755); // the postgres user must reach it
    return dir;
  }
  const inRepo = join(root, ".data", "pg");
  mkdirSync(join(root, ".data"), { recursive: true });
  if (!isRoot) return inRepo;
  // The postgres user must reach the folder; a clone under a private home cannot be reached, so fall back
  // to a per-checkout folder under /var/lib.
  const probe = run("runuser", ["-u", "postgres", "--", "test", "-x", join(root, ".data")], { allowFail: true, quiet: true });
  if (probe.status === 0) return inRepo;
  const alt = join("/var/lib/pourline", createHash("sha1").update(root).digest("hex").slice(0, 12));
  writeFileSync(join(root, ".data", "PG_DATA_IS_AT"), `${alt}\n`);
  return alt;
}

/** `command`: the npm command the person ran (for the message when the port is taken). */
export async function startPostgres({ bin, dataDir, port, fresh, command }) {
  const pgVersionFile = join(dataDir, "PG_VERSION");
  if (!existsSync(pgVersionFile)) {
    say(`creating a database cluster in ${dataDir} …`);
    mkdirSync(dataDir, { recursive: true });
    const pwfile = join(dataDir, "..", `.pw-${process.pid}`);
    writeFileSync(pwfile, "pourline\n", { mode: 0o644 });
    if (isRoot) run("chown", ["-R", "postgres:postgres", dataDir]);
    asPostgres(join(bin, "initdb"), ["-D", dataDir, "-U", "pourline", `--pwfile=${pwfile}`, "--auth-host=scram-sha-256", "--auth-local=trust", "-E", "UTF8", "--locale=C.UTF-8"], { quiet: true, what: "initdb" });
    rmSync(pwfile, { force: true });
  }
  const pidFile = join(dataDir, "postmaster.pid");
  if (existsSync(pidFile)) {
    const status = asPostgres(join(bin, "pg_ctl"), ["-D", dataDir, "status"], { allowFail: true, quiet: true });
    if (status.status === 0) {
      say(`PostgreSQL is already running on this data folder; using it (and leaving it running).`);
      // Someone else started it (another `npm start`): stopping it on our way out would pull it from under them.
      return { stop: () => {}, alreadyRunning: true };
    }
  }
  if (!(await portFree(port))) {
    fail(`port ${port} on 127.0.0.1 is taken by another program. Stop it, or choose another port: PGPORT=54330 npm ${command}`);
  }
  say(`starting PostgreSQL on 127.0.0.1:${port} …`);
  const log = join(dataDir, "server.log");
  const opts = `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories=${dataDir}` + (fresh ? " -c fsync=off -c synchronous_commit=off -c full_page_writes=off" : "");
  asPostgres(join(bin, "pg_ctl"), ["-D", dataDir, "-o", opts, "-l", log, "-w", "-t", "60", "start"], {
    quiet: true,
    what: "PostgreSQL start",
  });
  return { stop: () => stopPostgres(bin, dataDir) };
}

export function stopPostgres(bin, dataDir) {
  asPostgres(join(bin, "pg_ctl"), ["-D", dataDir, "-m", "fast", "-w", "stop"], { allowFail: true, quiet: true });
}

export function ensureDatabase(bin, port, name) {
  const env = { ...process.env, PGPASSWORD: "pourline" };
  const q = run(join(bin, "psql"), ["-h", "127.0.0.1", "-p", String(port), "-U", "pourline", "-d", "postgres", "-tAc", `SELECT 1 FROM pg_database WHERE datname='${name}'`], { quiet: true, env, what: "psql" });
  if (q.stdout.trim() !== "1") run(join(bin, "createdb"), ["-h", "127.0.0.1", "-p", String(port), "-U", "pourline", name], { quiet: true, env, what: `createdb ${name}` });
}

function psqlAdmin(bin, port, db, sql) {
  const env = { ...process.env, PGPASSWORD: "pourline" };
  return run(join(bin, "psql"), ["-h", "127.0.0.1", "-p", String(port), "-U", "pourline", "-d", db, "-v", "ON_ERROR_STOP=1", "-qtAc", sql], { quiet: true, env, what: `psql (${db})` });
}

export function ensureAppRole(bin, port, db, password) {
  return ensureAppRoleWith((database, sql) => psqlAdmin(bin, port, database, sql), { port, db, password });
}
