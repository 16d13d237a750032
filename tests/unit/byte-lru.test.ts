/**
 * The byte-bounded LRU that keeps stored run results in the app's memory (src/lib/byte-lru.ts): never over its
 * budget, least recently used out first, a hit counts as a use, a value too big for the budget not kept. The
 * property compares it with a plain model (an array of keys in use order) over random operation sequences.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { ByteLru } from "@/lib/byte-lru";

describe("ByteLru", () => {
  it("evicts the least recently used entries once over budget; a hit makes an entry recent", () => {
    const lru = new ByteLru<string>(100);
    lru.set("a", "A", 40);
    lru.set("b", "B", 40);
    expect(lru.get("a")).toBe("A"); // a is now more recent than b
    lru.set("c", "C", 40); // 120 > 100: b goes
    expect(lru.get("b")).toBeUndefined();
    expect(lru.get("a")).toBe("A");
    expect(lru.get("c")).toBe("C");
    expect(lru.bytes).toBe(80);
  });

  it("replaces a key's value and its size", () => {
    const lru = new ByteLru<string>(100);
    lru.set("a", "A1", 60);
    lru.set("a", "A2", 30);
    expect(lru.get("a")).toBe("A2");
    expect(lru.bytes).toBe(30);
    expect(lru.size).toBe(1);
  });

  it("does not keep a value larger than the whole budget (and drops an older value of that key)", () => {
    const lru = new ByteLru<string>(100);
    lru.set("a", "small", 10);
    lru.set("a", "huge", 101);
    expect(lru.get("a")).toBeUndefined();
    expect(lru.bytes).toBe(0);
  });

  it("behaves like the model: the most recently used keys that fit, in order, within the budget", () => {
    const op = fc.oneof(
      fc.record({ kind: fc.constant("set" as const), key: fc.integer({ min: 0, max: 7 }), bytes: fc.integer({ min: 0, max: 60 }) }),
      fc.record({ kind: fc.constant("get" as const), key: fc.integer({ min: 0, max: 7 }) }),
    );
    fc.assert(
      fc.property(fc.array(op, { maxLength: 60 }), (ops) => {
        const budget = 100;
        const lru = new ByteLru<number>(budget);
        let model: { key: string; bytes: number; value: number }[] = []; // least recent first
        ops.forEach((o, i) => {
          const key = `k${o.key}`;
          if (o.kind === "get") {
            const found = model.find((e) => e.key === key);
            expect(lru.get(key)).toBe(found?.value);
            if (found) model = [...model.filter((e) => e !== found), found];
            return;
          }
          lru.set(key, i, o.bytes);
          model = model.filter((e) => e.key !== key);
          if (o.bytes <= budget) model.push({ key, bytes: o.bytes, value: i });
          while (model.reduce((n, e) => n + e.bytes, 0) > budget) model.shift();
          expect(lru.bytes).toBe(model.reduce((n, e) => n + e.bytes, 0));
          expect(lru.size).toBe(model.length);
        });
        expect(lru.bytes).toBeLessThanOrEqual(budget);
      }),
    );
  });
});
