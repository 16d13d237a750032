import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { small } from "./engine-fixtures";

const root = new URL("../..", import.meta.url).pathname;
const cli = (...args: string[]) => spawnSync("npx", ["tsx", "scripts/sim-cli.ts", ...args], { cwd: root, encoding: "utf8", timeout: 60_000 });

describe("sim CLI", { timeout: 60_000 }, () => {
  it("prints one JSON object with the documented fields", () => {
    const r = cli("scenarios/small-deterministic.json", "--iterations", "5", "--seed", "cli", "--json");
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.iterations).toBe(5);
    expect(out.seed).toBe("cli");
    // Hand-worked in engine-handworked.test.ts: the small scenario finishes Wed 2027-04-07 09:00.
    expect(out.finish).toEqual({ p10: "2027-04-07", p50: "2027-04-07", p80: "2027-04-07", p90: "2027-04-07" });
    expect(out.operations.map((o: { id: string }) => o.id)).toEqual(["milling", "overlay"]);
    expect(out.operations[0].finish.p50).toBe("2027-04-06");
    expect(out.operations[1].finish.p80).toBe("2027-04-07");
    expect(out.weatherLostShifts.p50).toBe(0);
    expect(out.convergence).toBe(0);
  });

  it("adds delay and cost percentiles with a traffic section, and the holiday trade-off with --tradeoff", () => {
    const r = cli("scenarios/kestrel-two-season.json", "--iterations", "6", "--seed", "cli", "--json", "--tradeoff");
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    for (const q of [out.delay.vehicleHours, out.cost.roadUser, out.cost.contract]) {
      expect(typeof q.p50).toBe("number");
      expect(q.p80).toBeGreaterThanOrEqual(q.p50);
    }
    expect(out.delay.vehicleHours.p50).toBeGreaterThan(0);
    expect(out.cost.valueOfTimeYear).toBe(2015);
    // Days whose longest queue broke the scenario's limit (the default 1 mile: the file states none), P50/P80 over iterations.
    expect(out.queueLimitBreaches.limit).toEqual({ unit: "miles", value: 1 });
    expect(out.queueLimitBreaches.p80).toBeGreaterThanOrEqual(out.queueLimitBreaches.p50);
    expect(out.tradeoff.iterations).toBe(6);
    expect(out.tradeoff.standDown.policy).toBe("standDown");
    expect(typeof out.tradeoff.daysGained.p50).toBe("number");
    // The small deck has no traffic or costs section: no such keys.
    const plain = JSON.parse(cli("scenarios/small-deterministic.json", "--iterations", "2", "--json").stdout);
    expect("delay" in plain || "cost" in plain || "queueLimitBreaches" in plain).toBe(false);
  });

  it("a queue limit in minutes of delay from the command line replaces the scenario's; a looser limit never counts more days", () => {
    const run = (...limit: string[]) => {
      const r = cli("scenarios/kestrel-two-season.json", "--iterations", "4", "--seed", "cli-limit", "--json", ...limit);
      expect(r.status, r.stderr).toBe(0);
      return JSON.parse(r.stdout).queueLimitBreaches;
    };
    const tight = run("--queue-limit-minutes", "5");
    const loose = run("--queue-limit-minutes", "240");
    expect(tight.limit).toEqual({ unit: "minutes", value: 5 });
    expect(loose.limit).toEqual({ unit: "minutes", value: 240 });
    // The same iterations: every day over 240 minutes of delay is also over 5 minutes.
    expect(tight.p50).toBeGreaterThanOrEqual(loose.p50);
    expect(tight.p80).toBeGreaterThanOrEqual(loose.p80);
    expect(tight.p50).toBeGreaterThan(0);
  });

  it("refuses a queue limit out of range, or one in both units, naming the option", () => {
    const zero = cli("scenarios/small-deterministic.json", "--queue-limit-minutes", "0");
    expect(zero.status).toBe(2);
    expect(zero.stderr).toContain("--queue-limit-minutes must be at least 1 minute");
    const both = cli("scenarios/small-deterministic.json", "--queue-limit-miles", "1", "--queue-limit-minutes", "15");
    expect(both.status).toBe(2);
    expect(both.stderr).toContain("give one queue limit, in miles or in minutes, not both");
  });

  it("prints a readable summary without --json", () => {
    const r = cli("scenarios/small-deterministic.json", "--iterations", "2");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/Finish {2}P10 2027-04-07/);
  });

  it("exits 2 with each problem as path: message for an invalid scenario", () => {
    const dir = mkdtempSync(join(tmpdir(), "pourline-cli-"));
    const file = join(dir, "bad.json");
    writeFileSync(file, JSON.stringify(small((s) => {
      s.deck.lengthFt = 0;
      s.links.push({ from: "overlay", to: "milling" });
    })));
    const r = cli(file, "--json");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("deck.lengthFt: must be > 0");
    expect(r.stdout).toBe("");
  });

  it("exits 2 for an unreadable file, invalid JSON and a bad option", () => {
    const missing = cli("scenarios/does-not-exist.json");
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/cannot read scenario file/);
    const dir = mkdtempSync(join(tmpdir(), "pourline-cli-"));
    writeFileSync(join(dir, "x.json"), "{ not json");
    const bad = cli(join(dir, "x.json"));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/not valid JSON/);
    const opt = cli("scenarios/small-deterministic.json", "--iterations", "many");
    expect(opt.status).toBe(2);
    expect(opt.stderr).toMatch(/--iterations must be a whole number/);
  });
});
