// What must be installed before anything runs: the npm dependencies, Debian's PostgreSQL and (for the browser
// tests) Debian's Chromium — each installed only when missing.
import { existsSync, readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { fail, isRoot, root, run, say } from "./shell.mjs";

export function ensureNodeModules() {
  const marker = join(root, "node_modules", ".package-lock.json");
  const lock = join(root, "package-lock.json");
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  say("installing npm dependencies (npm ci) …");
  // --loglevel=error: npm's notices (install scripts it has not been told to allow, funding) are not for a newcomer.
  const r = run("npm", ["ci", "--no-audit", "--no-fund", "--loglevel=error"], { allowFail: true, what: "npm ci" });
  if (r.status !== 0) fail("npm could not install the dependencies. Check the network to the npm registry and run `npm start` again.");
}

function pgBinDir() {
  const base = "/usr/lib/postgresql";
  if (!existsSync(base)) return null;
  const versions = readdirSync(base).filter((v) => existsSync(join(base, v, "bin", "initdb"))).sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], "bin") : null;
}

function aptInstall(pkg, what) {
  if (!isRoot) fail(`${what} is not installed. Install it with: sudo apt-get install -y ${pkg}  (then run this command again)`);
  say(`installing ${what} from Debian (apt-get install ${pkg}) …`);
  run("apt-get", ["update", "-qq"], { allowFail: true, quiet: true });
  const r = run("apt-get", ["install", "-y", "-qq", pkg], { allowFail: true, quiet: true, env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
  if (r.status !== 0) fail(`apt-get could not install ${pkg}:\n${(r.stderr || "").trim().split("\n").slice(-5).join("\n")}`);
}

export function ensurePostgresInstalled() {
  let bin = pgBinDir();
  if (!bin) {
    aptInstall("postgresql", "PostgreSQL");
    bin = pgBinDir();
    if (!bin) fail("PostgreSQL was installed but its programs were not found under /usr/lib/postgresql/*/bin.");
  }
  return bin;
}

export function ensureChromium() {
  if (existsSync("/usr/bin/chromium")) return;
  aptInstall("chromium", "Chromium (for the browser tests)");
}
