/**
 * Whether a newer forecast changes the closures the public was told of, from today on (src/lib/closure-changes.ts):
 * worked cases by hand and properties over random timelines.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { closureChanges, closureChangesText, closureTimeline } from "../../src/lib/closure-changes";
import type { ClosurePeriodSummary } from "../../sim/run-summary-schema";

const night = (start: string, end: string, lanes = ["L2"]): ClosurePeriodSummary => ({ closure: "night", name: "Night one-lane closure", kind: "short", lanes, start, end });
const TODAY = "2026-12-08";

describe("closureChanges", () => {
  const published = [night("2026-12-06T21:00", "2026-12-07T05:00"), night("2026-12-07T21:00", "2026-12-08T05:00"), night("2026-12-08T21:00", "2026-12-09T05:00"), night("2026-12-09T21:00", "2026-12-10T05:00")];

  it("is null for the same closures, in any order, and for changes that lie wholly before today", () => {
    expect(closureChanges(published, [...published].reverse(), TODAY)).toBeNull();
    // The first night ended before today began: a forecast that moved it tells the public nothing new.
    expect(closureChanges(published, [night("2026-12-05T21:00", "2026-12-06T05:00"), ...published.slice(1)], TODAY)).toBeNull();
  });

  it("counts the published periods from today on that are gone and the new ones, with the first day that differs", () => {
    // The night of the 9th moved a day later; the night of the 8th stands.
    const moved = [...published.slice(0, 3), night("2026-12-10T21:00", "2026-12-11T05:00")];
    // Three periods end after the 8th began (the one that ran past its midnight counts).
    expect(closureChanges(published, moved, TODAY)).toEqual({ gone: 1, added: 1, published: 3, firstDay: "2026-12-09" });
    expect(closureChangesText(closureChanges(published, moved, TODAY)!)).toBe(
      "1 of the 3 closures published from today on is not in the newest forecast, which has 1 closure the public has not been told of; the first difference is on Wed 9 Dec 2026.",
    );
  });

  it("a period that began before today and now has other lanes differs from today on", () => {
    const otherLanes = published.map((p, i) => (i === 1 ? night(p.start, p.end, ["L1"]) : p));
    expect(closureChanges(published, otherLanes, TODAY)).toEqual({ gone: 1, added: 1, published: 3, firstDay: TODAY });
  });

  it("says dropped closures and new ones alone in words of their own", () => {
    const dropped = closureChanges(published, published.slice(0, 2), TODAY)!;
    expect(dropped).toEqual({ gone: 2, added: 0, published: 3, firstDay: TODAY });
    expect(closureChangesText(dropped)).toBe("2 of the 3 closures published from today on are not in the newest forecast; the first difference is on Tue 8 Dec 2026.");
    const added = closureChanges(published.slice(0, 1), published, TODAY)!;
    expect(added).toEqual({ gone: 0, added: 3, published: 0, firstDay: TODAY });
    expect(closureChangesText(added)).toBe("The newest forecast has 3 closures the public has not been told of from today on; the first difference is on Tue 8 Dec 2026.");
  });

  it("holds its properties over random timelines: null against itself; swapping the two swaps gone and added", () => {
    const hour = fc.integer({ min: 0, max: 24 * 20 });
    const at = (h: number) => {
      const d = new Date(Date.UTC(2026, 11, 1) + h * 3_600_000).toISOString();
      return `${d.slice(0, 10)}T${d.slice(11, 16)}`;
    };
    const period = fc.record({ h: hour, len: fc.integer({ min: 1, max: 30 }), lane: fc.constantFrom("L1", "L2", "L3") }).map(({ h, len, lane }) => night(at(h), at(h + len), [lane]));
    const timeline = fc.array(period, { maxLength: 12 });
    fc.assert(
      fc.property(timeline, timeline, fc.integer({ min: 0, max: 20 }), (a, b, d) => {
        const today = at(d * 24).slice(0, 10);
        expect(closureChanges(a, a, today)).toBeNull();
        const ab = closureChanges(a, b, today);
        const ba = closureChanges(b, a, today);
        expect(ab === null).toBe(ba === null);
        if (ab && ba) {
          expect([ab.gone, ab.added, ab.firstDay]).toEqual([ba.added, ba.gone, ba.firstDay]);
          expect(ab.firstDay >= today).toBe(true);
          expect(ab.gone).toBeLessThanOrEqual(ab.published);
        }
      }),
    );
  });
});

describe("closureTimeline", () => {
  it("reads a stored timeline by the run-result contract, and nothing else", () => {
    const stored = [night("2026-12-08T21:00", "2026-12-09T05:00")];
    expect(closureTimeline(JSON.parse(JSON.stringify(stored)))).toEqual(stored);
    expect(closureTimeline(null)).toBeNull();
    expect(closureTimeline([{ closure: "night" }])).toBeNull();
  });
});
