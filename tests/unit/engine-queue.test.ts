import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { EventQueue } from "../../sim/queue";

describe("EventQueue", () => {
  it("pops in (time, sequence) order whatever the insertion order", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 5 })), { maxLength: 200 }), (items) => {
        const q = new EventQueue(2);
        items.forEach(([t, s], i) => q.push(t, s, i));
        const out: [number, number][] = [];
        while (q.size > 0) {
          const i = q.pop();
          expect([q.lastTime, q.lastSeq]).toEqual(items[i]);
          out.push(items[i]);
        }
        const sorted = [...items].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
        expect(out).toEqual(sorted);
      }),
    );
  });

  it("refuses to pop when empty", () => {
    expect(() => new EventQueue().pop()).toThrow(/empty/);
    expect(new EventQueue().peekTime()).toBe(Infinity);
  });
});
