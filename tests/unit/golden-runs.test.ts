/**
 * Every column of every demo's run, bit for bit, as the fixture recorded it (tests/helpers/golden-runs.ts).
 * Speed work must leave this green; a model change rewrites the fixture on purpose and says so.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { demoFiles, fingerprintDemo, GOLDEN_FILE, type Fingerprint } from "../helpers/golden-runs";

const golden = JSON.parse(readFileSync(GOLDEN_FILE, "utf8")) as Record<string, Fingerprint>;

describe("golden runs of the demo scenarios", () => {
  it("has a recorded run for every demo in scenarios/", () => {
    expect(Object.keys(golden).sort()).toEqual(demoFiles());
  });
  for (const file of demoFiles()) {
    it(`${file}: every column unchanged`, () => {
      expect(fingerprintDemo(file)).toEqual(golden[file]);
    });
  }
});
