/**
 * The pool splits iterations over workers and must give, bit for bit, what one worker gives. The engine API a
 * Web Worker exposes runs here in-process, so this exercises the real engine, split and merge.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { createEngineApi } from "../../workers/engine-api";
import { runInPool, type EngineHandle, type PoolProgress } from "../../workers/pool";
import { poolSize, splitIterations } from "../../workers/ranges";

const small = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
// The same small deck with random weather and production, so the iterations differ from each other.
const stochastic = {
  ...small,
  weather: { ...small.weather, mode: "stochastic", monthly: small.weather.monthly.map((m: Record<string, number>) => ({ ...m, tmaxSdF: 7, tminSdF: 6, pWetAfterDry: 0.25, pWetAfterWet: 0.5 })) },
  operations: small.operations.map((o: Record<string, unknown>, i: number) =>
    i === 0 ? { ...o, rate: { unit: "ftPerHour", dist: { type: "triangular", min: 10, mode: 25, max: 60 } } } : o,
  ),
};

function inProcessEngine(): EngineHandle {
  return { api: createEngineApi(), terminate: () => {} };
}

describe("splitIterations", () => {
  it("covers [0, n) exactly once, in order, for any n and worker count", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.integer({ min: 1, max: 16 }), (n, w) => {
        const ranges = splitIterations(n, w);
        expect(ranges[0].from).toBe(0);
        expect(ranges[ranges.length - 1].to).toBe(n);
        for (let i = 1; i < ranges.length; i++) expect(ranges[i].from).toBe(ranges[i - 1].to);
        expect(ranges.length).toBeLessThanOrEqual(Math.min(n, w));
        const sizes = ranges.map((r) => r.to - r.from);
        expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
      }),
    );
  });

  it("uses every core up to four, leaves one for the page above that, and stays within 1–8 workers", () => {
    expect(poolSize(undefined)).toBe(2);
    expect(poolSize(1)).toBe(1);
    expect(poolSize(2)).toBe(2);
    expect(poolSize(4)).toBe(4);
    expect(poolSize(6)).toBe(5);
    expect(poolSize(64)).toBe(8);
  });
});

describe("runInPool", () => {
  it("gives the same summary with 1, 2 and 3 workers for the same seed", async () => {
    const run = (workers: number) => runInPool({ input: stochastic, iterations: 120, seed: "pool", workers, createEngine: inProcessEngine }).result;
    const [one, two, three] = await Promise.all([run(1), run(2), run(3)]);
    expect(one).not.toBeNull();
    expect(two!.summary).toEqual(one!.summary);
    expect(three!.summary).toEqual(one!.summary);
    // The iterations really differ, so agreement is not trivial.
    expect(one!.summary.histogram.filter((b) => b.count > 0).length).toBeGreaterThan(1);
  });

  it("reports progress up to the total", async () => {
    const seen: PoolProgress[] = [];
    await runInPool({ input: stochastic, iterations: 60, seed: "p", workers: 2, createEngine: inProcessEngine, onProgress: (p) => seen.push(p) }).result;
    expect(seen.at(-1)!.done).toBe(60);
    expect(seen.at(-1)!.total).toBe(60);
    for (let i = 1; i < seen.length; i++) expect(seen[i].done).toBeGreaterThanOrEqual(seen[i - 1].done);
  });

  it("a cancelled run resolves to null and terminates every worker", async () => {
    let terminated = 0;
    const slow: () => EngineHandle = () => ({
      api: { ...createEngineApi(), runRange: () => new Promise(() => {}) } as ReturnType<typeof createEngineApi>,
      terminate: () => void terminated++,
    });
    const run = runInPool({ input: stochastic, iterations: 100, seed: "c", workers: 3, createEngine: slow });
    run.cancel();
    expect(await run.result).toBeNull();
    expect(terminated).toBe(3);
  });

  it("an invalid scenario fails with the field problems", async () => {
    const bad = { ...small, deck: { ...small.deck, lengthFt: -1 } };
    await expect(runInPool({ input: bad, iterations: 10, seed: "x", workers: 1, createEngine: inProcessEngine }).result).rejects.toThrow(/deck.lengthFt/);
  });
});
