/**
 * The job worker's V8 inlining budgets (workers/server/engine-v8.ts): every flag is one this Node's V8 knows
 * (an unknown flag is only a line on stderr, so a Node that dropped one would silently lose the speed), the
 * switch back to V8's defaults, and the promise the module makes — the same results bit for bit: the golden
 * runs computed in a process with the budgets equal the recorded ones.
 */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { ENGINE_V8_FLAGS, tuneV8ForEngine } from "../../workers/server/engine-v8";
import { GOLDEN_FILE } from "../helpers/golden-runs";

const root = fileURLToPath(new URL("../..", import.meta.url));

describe("the engine worker's V8 settings", () => {
  it.each(ENGINE_V8_FLAGS)("%s is a flag this Node's V8 accepts", (flag) => {
    const r = spawnSync(process.execPath, ["-e", `require("node:v8").setFlagsFromString(${JSON.stringify(flag)})`], { encoding: "utf8" });
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    const known = spawnSync(process.execPath, [flag, "-e", "0"], { encoding: "utf8" });
    expect(known.stderr).toBe("");
  });

  it("POURLINE_V8_DEFAULTS=1 leaves V8 as it is", () => {
    expect(tuneV8ForEngine({ POURLINE_V8_DEFAULTS: "1" })).toBe(false);
  });

  it("leaves every demo's golden run unchanged", () => {
    const r = spawnSync("npx", ["tsx", "tests/helpers/golden-runs.ts", "--print-with-worker-v8"], { cwd: root, encoding: "utf8", timeout: 120_000 });
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout.trim().split("\n").pop()!)).toEqual(JSON.parse(readFileSync(GOLDEN_FILE, "utf8")));
  }, 150_000);
});
