import { describe, expect, it } from "vitest";
import { resultKey, runJobKey } from "../../src/lib/run-keys";
import { MODEL_REVISION } from "../../sim/model-revision";

describe("names of computations", () => {
  const plan = { scenarioId: "s1", scenarioVersion: 3, seed: "pourline", iterations: 2000 };

  it("name the model rules' revision, so a run the old rules gave is not handed out for the same inputs after a change", () => {
    expect(resultKey(plan)).toContain(`:m${MODEL_REVISION}`);
    expect(runJobKey(plan)).toContain(`:m${MODEL_REVISION}`);
  });

  it("tell apart every input a result depends on", () => {
    const keys = new Set([
      resultKey(plan),
      resultKey({ ...plan, scenarioVersion: 4 }),
      resultKey({ ...plan, seed: "other" }),
      resultKey({ ...plan, iterations: 1000 }),
      resultKey({ ...plan, reforecast: { dataDate: "2026-10-31", inputsHash: "a" } }),
      resultKey({ ...plan, reforecast: { dataDate: "2026-10-31", inputsHash: "b" } }),
      resultKey({ ...plan, reforecast: { dataDate: "2026-11-01", inputsHash: "a" } }),
    ]);
    expect(keys.size).toBe(7);
    expect(runJobKey(plan)).not.toBe(runJobKey({ ...plan, reforecast: { dataDate: "2026-10-31", inputsHash: "a" } }));
  });
});
