/**
 * A background pass works each project on its own: one that throws is logged (by its key and the error's class or
 * SQLSTATE, never the message, which may quote data) once while it keeps failing the same way, and the others are
 * still worked — the weekly closure e-mail, the daily re-forecast, the look-ahead notices and the forecast e-mails
 * all run through it.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { eachItemOnItsOwn, startBackgroundPass } from "@/lib/server/background-pass";
import { DatabaseError } from "@db/safe-errors";

let logged: string[];
beforeEach(() => {
  logged = [];
  vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => void logged.push(args.join(" ")));
});
afterEach(() => vi.restoreAllMocks());

describe("eachItemOnItsOwn", () => {
  it("goes on past an item that throws, and counts it", async () => {
    const worked: string[] = [];
    const failed = await eachItemOnItsOwn("test pass a", ["p1", "p2", "p3"], (p) => p, async (p) => {
      if (p === "p1") throw new TypeError("cannot read the plan of Kestrel Creek for jane@example.com");
      worked.push(p);
    });
    expect(worked).toEqual(["p2", "p3"]);
    expect(failed).toBe(1);
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatch(/^\[pourline\] test pass a for p1 failed: TypeError\n\s+at /);
    expect(logged[0]).not.toContain("jane@example.com"); // the message may quote data: left out
  });

  it("logs an item failing the same way once, again when it fails differently, and again after it has worked", async () => {
    let error: Error | null = new DatabaseError("23505", "projects", "a_key");
    const pass = () => eachItemOnItsOwn("test pass b", ["only"], (p) => p, async () => {
      if (error) throw error;
    });
    await pass();
    await pass();
    expect(logged).toEqual(["[pourline] test pass b for only failed: DatabaseError: Database query failed (23505, table projects, constraint a_key)"]);
    error = new DatabaseError("57P01");
    await pass();
    expect(logged).toHaveLength(2);
    error = null;
    expect(await pass()).toBe(0);
    error = new DatabaseError("57P01");
    await pass();
    expect(logged).toHaveLength(3);
  });

  it("keeps two passes' failures of the same key apart", async () => {
    const boom = async () => {
      throw new RangeError("x");
    };
    await eachItemOnItsOwn("test pass c", ["k"], (p) => p, boom);
    await eachItemOnItsOwn("test pass d", ["k"], (p) => p, boom);
    expect(logged.map((l) => l.split(" failed")[0])).toEqual(["[pourline] test pass c for k", "[pourline] test pass d for k"]);
  });
});

describe("startBackgroundPass", () => {
  it("runs the pass on its interval and logs a failing pass once while it fails the same way, again when it fails differently", async () => {
    vi.useFakeTimers();
    try {
      const errors = [new DatabaseError("57P01"), new DatabaseError("57P01"), new DatabaseError("08006"), null];
      let runs = 0;
      startBackgroundPass("test pass e", 1_000, async () => {
        const e = errors[runs++];
        if (e) throw e;
      });
      for (let i = 0; i < 4; i++) await vi.advanceTimersByTimeAsync(1_000);
      expect(runs).toBe(4);
      expect(logged).toEqual([
        "[pourline] test pass e pass failed: DatabaseError: Database query failed (57P01)",
        "[pourline] test pass e pass failed: DatabaseError: Database query failed (08006)",
      ]);
    } finally {
      vi.useRealTimers();
    }
  });
});

