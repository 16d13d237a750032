/**
 * `npm run bench -- --baseline <git revision> [--json] [--iterations N] [--rounds N]`: this checkout's engine
 * against the engine of an earlier revision, on the main demo, in one process, round after round in turn.
 * Why: this machine is shared and its speed drifts by 2–3× between hours, so an engine figure from another day
 * (or a target set on one) says little on its own; two engines measured in alternating rounds in the same minutes
 * see the same machine, and their ratio is the figure that travels. Each side is that revision's own `sim/`
 * and its own copy of the main demo (scenario formats change between revisions), bundled alike with esbuild
 * (packages from this checkout's node_modules), warmed up, then timed in process CPU time; the best round of
 * each counts, as in the main bench, and the median of the per-pair ratios is printed beside it.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { build } from "esbuild";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const MAIN = "scenarios/kestrel-two-season.json";
const SEED = "bench";

/** The three entry points sim/index has exported since the Monte Carlo loop was written (older revisions are refused). */
interface EngineModule {
  parseScenario(raw: unknown): { ok: boolean; scenario?: unknown; problems?: { path: string; message: string }[] };
  compileScenario(s: unknown): unknown;
  runIterations(c: unknown, seed: string, from: number, to: number): { finish: Float64Array };
}

interface Side {
  label: string;
  engine: EngineModule;
  compiled: unknown;
}

function git(args: string[]): string {
  const r = spawnSync("git", args, { cwd: ROOT, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`git ${args.join(" ")} failed: ${(r.stderr || "").trim() || `exit ${r.status}`}`);
  return r.stdout.trim();
}

/** The revision's sim/ and scenarios/ into `dir` (git archive: nothing of the working tree). */
function extractRevision(rev: string, dir: string): string {
  const sha = git(["rev-parse", "--verify", `${rev}^{commit}`]);
  const archive = spawnSync("git", ["archive", "--format=tar", sha, "sim", "scenarios"], { cwd: ROOT, maxBuffer: 256 * 1024 * 1024 });
  if (archive.status !== 0) throw new Error(`git archive ${sha} failed: ${archive.stderr.toString().trim()}`);
  const untar = spawnSync("tar", ["-x", "-C", dir], { input: archive.stdout });
  if (untar.status !== 0) throw new Error(`unpacking ${sha} failed: ${untar.stderr.toString().trim()}`);
  return sha;
}

async function loadEngine(simDir: string, outFile: string): Promise<EngineModule> {
  await build({
    entryPoints: [join(simDir, "index.ts")],
    bundle: true,
    platform: "node",
    format: "esm",
    outfile: outFile,
    nodePaths: [join(ROOT, "node_modules")],
    logLevel: "error",
  });
  const mod = (await import(pathToFileURL(outFile).href)) as Partial<EngineModule>;
  for (const name of ["parseScenario", "compileScenario", "runIterations"] as const)
    if (typeof mod[name] !== "function") throw new Error(`${simDir}: sim/index exports no ${name} (too old a revision to compare)`);
  return mod as EngineModule;
}

function prepare(label: string, engine: EngineModule, scenarioFile: string): Side {
  const parsed = engine.parseScenario(JSON.parse(readFileSync(scenarioFile, "utf8")));
  if (!parsed.ok) throw new Error(`${label}: ${scenarioFile} does not parse: ${(parsed.problems ?? []).map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  return { label, engine, compiled: engine.compileScenario(parsed.scenario) };
}

function cpuMs(f: () => void): number {
  const c0 = process.cpuUsage();
  f();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function p50Days(finish: Float64Array): number {
  const s = Float64Array.from(finish).sort();
  return Math.round((s[Math.max(0, Math.ceil(0.5 * s.length) - 1)] / 24) * 10) / 10;
}

export async function benchBaseline(args: string[]): Promise<number> {
  const option = (name: string, fallback: number) => {
    const i = args.indexOf(name);
    const v = i >= 0 ? Number(args[i + 1]) : fallback;
    if (!Number.isInteger(v) || v < 1) throw new Error(`${name} must be a whole number of at least 1`);
    return v;
  };
  const rev = args[args.indexOf("--baseline") + 1];
  if (!rev || rev.startsWith("--")) throw new Error("--baseline needs a git revision (a commit, a tag, or e.g. HEAD~3)");
  const json = args.includes("--json");
  const iterations = option("--iterations", 500);
  const rounds = option("--rounds", 12);

  const dir = mkdtempSync(join(tmpdir(), "pourline-baseline-"));
  try {
    const sha = extractRevision(rev, dir);
    const baseline = prepare(`${rev} (${sha.slice(0, 10)})`, await loadEngine(join(dir, "sim"), join(dir, "baseline.mjs")), join(dir, MAIN));
    const current = prepare("this checkout", await loadEngine(join(ROOT, "sim"), join(dir, "current.mjs")), join(ROOT, MAIN));
    const sides = [baseline, current];
    const run = (s: Side) => s.engine.runIterations(s.compiled, SEED, 0, iterations);
    for (const s of sides) run(s); // warm-up
    const best = [Infinity, Infinity];
    const ratios: number[] = [];
    for (let r = 0; r < rounds; r++) {
      // Alternate which side goes first, so neither always meets the machine right after the other.
      const order = r % 2 ? [1, 0] : [0, 1];
      const ms = [0, 0];
      for (const i of order) ms[i] = cpuMs(() => run(sides[i]));
      for (let i = 0; i < 2; i++) best[i] = Math.min(best[i], ms[i]);
      ratios.push(ms[0] / ms[1]);
    }
    const rate = (ms: number) => Math.round((iterations / ms) * 1000);
    const out = {
      baseline: { rev, commit: sha, iterationsPerSecond: rate(best[0]), finishP50Days: p50Days(run(baseline).finish) },
      current: { iterationsPerSecond: rate(best[1]), finishP50Days: p50Days(run(current).finish) },
      scenario: MAIN,
      iterations,
      rounds,
      /** Best against best, and the median of the per-round ratios (> 1: this checkout is faster). */
      speedup: Math.round((best[0] / best[1]) * 100) / 100,
      medianRoundSpeedup: Math.round(median(ratios) * 100) / 100,
    };
    if (json) console.log(JSON.stringify({ baseline: out }, null, 2));
    else {
      console.log(`main demo, ${rounds} alternating rounds of ${iterations} iterations (best round, CPU time):`);
      console.log(`  ${baseline.label.padEnd(30)} ${String(out.baseline.iterationsPerSecond).padStart(6)} it/s   finish P50 ${out.baseline.finishP50Days} days`);
      console.log(`  ${current.label.padEnd(30)} ${String(out.current.iterationsPerSecond).padStart(6)} it/s   finish P50 ${out.current.finishP50Days} days`);
      console.log(`  speed-up ${out.speedup}× (median of rounds ${out.medianRoundSpeedup}×)`);
    }
    return 0;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
