import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { progressAnnouncement } from "@/components/run/progress-announcement";

describe("progressAnnouncement (what a screen reader hears while a run goes)", () => {
  it("names the quarter reached", () => {
    expect(progressAnnouncement(0)).toBe("Started.");
    expect(progressAnnouncement(0.24)).toBe("Started.");
    expect(progressAnnouncement(0.25)).toBe("25 % done.");
    expect(progressAnnouncement(0.5)).toBe("50 % done.");
    expect(progressAnnouncement(0.99)).toBe("75 % done.");
  });

  it("never says more than 75 % (the end is announced in the caller's own words) and survives a bad fraction", () => {
    expect(progressAnnouncement(1)).toBe("75 % done.");
    expect(progressAnnouncement(Number.NaN)).toBe("Started.");
    expect(progressAnnouncement(-1)).toBe("Started.");
  });

  it("changes at most four times over a whole run, however often progress arrives", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 500 }), (xs) => {
        const spoken = [...xs].sort((a, b) => a - b).map(progressAnnouncement);
        const changes = spoken.filter((s, i) => i === 0 || s !== spoken[i - 1]).length;
        expect(changes).toBeLessThanOrEqual(4);
      }),
    );
  });
});
