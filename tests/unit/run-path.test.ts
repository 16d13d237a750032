/**
 * The browser's run path around the engine: a worker that keeps its compiled scenario gives the numbers a
 * fresh one gives; a pool of ready workers leaves them running after a run and stops them on cancel; the pool
 * size asked for by hand; which run the Outlook shows while a browser run is saved; the delay chart's axis top.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { createEngineApi, partialBuffers } from "../../workers/engine-api";
import { runInPool, type EngineHandle } from "../../workers/pool";
import { requestedPoolSize } from "../../workers/ranges";
import { chooseShownRun, type LocalRun } from "../../src/components/run/local-runs";
import { niceCeiling, niceTicks } from "../../src/components/results/delay-panel";

const small = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
const stochastic = {
  ...small,
  weather: { ...small.weather, mode: "stochastic", monthly: small.weather.monthly.map((m: Record<string, number>) => ({ ...m, tmaxSdF: 7, tminSdF: 6, pWetAfterDry: 0.25, pWetAfterWet: 0.5 })) },
  operations: small.operations.map((o: Record<string, unknown>, i: number) =>
    i === 0 ? { ...o, rate: { unit: "ftPerHour", dist: { type: "triangular", min: 10, mode: 25, max: 60 } } } : o,
  ),
};

describe("a worker's kept compile", () => {
  it("gives, range after range and for the summary, exactly what a fresh worker gives", async () => {
    const kept = createEngineApi();
    expect(await kept.prepare(stochastic)).toBeGreaterThanOrEqual(0);
    // Other ranges first, so the compiled scenario has been used before the compared range runs.
    await kept.runRange(stochastic, "other-seed", 0, 40, () => {});
    const a = await kept.runRange(stochastic, "s", 0, 60, () => {});
    const b = await kept.runRange(stochastic, "s", 60, 100, () => {});
    expect(a.compileMs).toBe(0);
    const fresh = createEngineApi();
    const whole = await fresh.runRange(stochastic, "s", 0, 100, () => {});
    expect(Array.from(a.partial.finish)).toEqual(Array.from(whole.partial.finish.subarray(0, 60)));
    expect(Array.from(b.partial.finish)).toEqual(Array.from(whole.partial.finish.subarray(60)));
    expect(await kept.summarize(stochastic, [a.partial, b.partial])).toEqual(await createEngineApi().summarize(stochastic, [whole.partial]));
  });

  it("compiles again for another definition", async () => {
    const api = createEngineApi();
    await api.prepare(stochastic);
    const other = { ...stochastic, name: "Another plan" };
    const r = await api.runRange(other, "s", 0, 5, () => {});
    expect(r.partial.finish.length).toBe(5);
    expect((await api.summarize(other, [r.partial])).scenarioName).toBe("Another plan");
  });

  it("hands over every typed array's buffer (the partial run is moved, not copied, to the page)", async () => {
    const r = await createEngineApi().runRange(stochastic, "s", 0, 3, () => {});
    const buffers = partialBuffers([r.partial]);
    for (const v of Object.values(r.partial)) if (ArrayBuffer.isView(v)) expect(buffers).toContain(v.buffer);
  });
});

describe("a pool of ready workers", () => {
  const counted = () => {
    const stats = { created: 0, terminated: 0 };
    const make = (): EngineHandle => {
      stats.created++;
      return { api: createEngineApi(), terminate: () => void stats.terminated++ };
    };
    return { stats, make };
  };

  it("uses the ready workers, keeps them after the run and stops only those it had to create", async () => {
    const { stats, make } = counted();
    const ready = [make(), make()];
    const r = await runInPool({ input: stochastic, iterations: 90, seed: "p", workers: 3, engines: ready, createEngine: make }).result;
    expect(r!.summary.iterations).toBe(90);
    expect(r!.engineMs).toHaveLength(3);
    expect(stats.created).toBe(3);
    expect(stats.terminated).toBe(1);
  });

  it("stops every worker, ready ones too, when the run is cancelled", async () => {
    let terminated = 0;
    const busy = (): EngineHandle => ({ api: { ...createEngineApi(), runRange: () => new Promise(() => {}) }, terminate: () => void terminated++ });
    const run = runInPool({ input: stochastic, iterations: 100, seed: "c", workers: 2, engines: [busy(), busy()], createEngine: busy });
    run.cancel();
    expect(await run.result).toBeNull();
    expect(terminated).toBe(2);
  });
});

describe("requestedPoolSize", () => {
  it("takes the address first, then the stored setting, and only whole numbers 1–8", () => {
    expect(requestedPoolSize("2", "4")).toBe(2);
    expect(requestedPoolSize(null, "4")).toBe(4);
    expect(requestedPoolSize("", " ")).toBeNull();
    expect(requestedPoolSize("0", null)).toBeNull();
    expect(requestedPoolSize("9", "3")).toBe(3);
    expect(requestedPoolSize("1.5", "two")).toBeNull();
    expect(requestedPoolSize(undefined, "8")).toBe(8);
  });
});

describe("chooseShownRun", () => {
  const local = (over: Partial<LocalRun> = {}): LocalRun => ({
    scenarioId: "s",
    key: 'v3:10000:"x"',
    iterations: 10_000,
    seed: "x",
    summary: {} as LocalRun["summary"],
    computedAt: "2026-12-02T07:00:00Z",
    save: "saving",
    acknowledged: false,
    ...over,
  });

  it("shows the browser's run until the server's page shows it, then the server's with the summary already drawn", () => {
    expect(chooseShownRun(local(), 'v3:2000:"old"', 3)).toEqual({ show: "local", sameAsLocal: false });
    expect(chooseShownRun(local(), null, 3)).toEqual({ show: "local", sameAsLocal: false });
    expect(chooseShownRun(local({ save: "saved" }), 'v3:10000:"x"', 3)).toEqual({ show: "server", sameAsLocal: true });
  });

  it("leaves the server's run alone once it has caught up, when the save failed, or for another version", () => {
    expect(chooseShownRun(local({ save: "saved", acknowledged: true }), 'v3:5000:"someone else"', 3)).toEqual({ show: "server", sameAsLocal: false });
    expect(chooseShownRun(local({ save: "failed" }), 'v3:2000:"old"', 3)).toEqual({ show: "server", sameAsLocal: false });
    expect(chooseShownRun(local({ save: "failed" }), null, 3)).toEqual({ show: "none", sameAsLocal: false });
    expect(chooseShownRun(local(), 'v4:2000:"old"', 4)).toEqual({ show: "server", sameAsLocal: false });
    expect(chooseShownRun(null, null, 3)).toEqual({ show: "none", sameAsLocal: false });
  });
});

describe("niceCeiling", () => {
  it("rounds up to 1, 2 or 5 times a power of ten", () => {
    expect([0, 0.3, 1, 7, 11, 16, 20, 21, 48, 230].map(niceCeiling)).toEqual([1, 0.5, 1, 10, 20, 20, 20, 50, 50, 500]);
  });
});

describe("niceTicks", () => {
  it("splits the axis into equal steps that end on its top", () => {
    expect(niceTicks(50)).toEqual([0, 10, 20, 30, 40, 50]);
    expect(niceTicks(20)).toEqual([0, 5, 10, 15, 20]);
    expect(niceTicks(10)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(0.5)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(niceTicks(200)).toEqual([0, 50, 100, 150, 200]);
  });
  it("gives equal steps for every top niceCeiling can choose", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (max) => {
        const top = niceCeiling(max);
        const t = niceTicks(top);
        expect(t[0]).toBe(0);
        expect(t[t.length - 1]).toBeCloseTo(top, 9);
        const step = t[1] - t[0];
        for (let i = 1; i < t.length; i++) expect(t[i] - t[i - 1]).toBeCloseTo(step, 9);
      }),
    );
  });
});
