// Time–distance lines from a trace: pauses become gaps, touching packets join, unfinished packets are counted.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { PauseRecord, Trace, TracePacket } from "@sim/engine";
import { packetStations, timeDistanceSeries, type DeckGeometry } from "@/components/results/time-distance-series";

const deck: DeckGeometry = { startStationFt: 1000, lengthFt: 250, packetFt: 100 };
const id = (h: number) => h;
const ops = [{ id: "mill", name: "Milling" }];

describe("packetStations", () => {
  it("offsets from the deck start; the last packet is short", () => {
    expect(packetStations(deck, 0)).toEqual([1000, 1100]);
    expect(packetStations(deck, 2)).toEqual([1200, 1250]);
  });
});

describe("timeDistanceSeries", () => {
  it("hand-worked: a night gap splits a packet in proportion to worked hours, touching packets join", () => {
    // Packet 1 works 9–17 (8 h) and 31–33 (2 h): 8/10 of its 100 ft by 17:00, so STA 11+80 at the gap.
    const trace: Trace = {
      packets: [
        { op: "mill", packet: 0, crew: 0, start: 7, finish: 9 },
        { op: "mill", packet: 1, crew: 0, start: 9, finish: 33 },
        { op: "mill", packet: 2, crew: 0, start: 33, finish: 34 },
      ],
      pauses: [{ op: "mill", packet: 1, crew: 0, start: 17, end: 31, reason: "closed" }],
    };
    const [s] = timeDistanceSeries(trace, deck, ops, id);
    expect(s.points).toEqual([
      { x: 7, y: 1000 },
      { x: 9, y: 1100 },
      { x: 17, y: 1180 },
      { x: 17, y: null },
      { x: 31, y: 1180 },
      { x: 33, y: 1200 },
      { x: 34, y: 1250 },
    ]);
    expect(s.pieces).toBe(2);
    expect(s.pausedHours).toEqual({ weather: 0, closed: 14 });
    expect(s.firstStart).toBe(7);
    expect(s.lastFinish).toBe(34);
  });

  it("a weather wait then a calendar gap in one packet are one merged gap; pauses outside the packet are ignored", () => {
    const trace: Trace = {
      packets: [{ op: "mill", packet: 0, crew: 0, start: 10, finish: 40 }],
      pauses: [
        { op: "mill", packet: 0, crew: 0, start: 2, end: 10, reason: "weather" }, // before production: not a gap
        { op: "mill", packet: 0, crew: 0, start: 14, end: 17, reason: "weather" },
        { op: "mill", packet: 0, crew: 0, start: 17, end: 34, reason: "closed" },
      ],
    };
    const [s] = timeDistanceSeries(trace, deck, ops, id);
    // Worked 10–14 and 34–40: 4 of 10 h → 40 ft at the gap.
    expect(s.points).toEqual([
      { x: 10, y: 1000 },
      { x: 14, y: 1040 },
      { x: 14, y: null },
      { x: 34, y: 1040 },
      { x: 40, y: 1100 },
    ]);
    expect(s.pausedHours).toEqual({ weather: 3, closed: 17 });
  });

  it("two crews working side by side do not join; a null finish (stored Infinity) is counted, not drawn", () => {
    const trace = {
      packets: [
        { op: "mill", packet: 0, crew: 0, start: 0, finish: 5 },
        { op: "mill", packet: 1, crew: 1, start: 0, finish: 5 },
        { op: "mill", packet: 2, crew: 0, start: 5, finish: null },
      ],
      pauses: [],
    } as unknown as Trace;
    const [s] = timeDistanceSeries(trace, deck, ops, id);
    expect(s.pieces).toBe(2);
    expect(s.points.filter((p) => p.y === null)).toHaveLength(1);
    expect(s.unfinishedPackets).toBe(1);
  });

  it("maps hours with toX and keeps operation order, adding trace-only operations", () => {
    const trace: Trace = {
      packets: [
        { op: "cure", packet: 0, crew: -1, start: 24, finish: 48 },
        { op: "mill", packet: 0, crew: 0, start: 0, finish: 12 },
      ],
      pauses: [],
    };
    const series = timeDistanceSeries(trace, deck, ops, (h) => 100 + h / 24);
    expect(series.map((s) => s.id)).toEqual(["mill", "cure"]);
    expect(series[0].points).toEqual([{ x: 100, y: 1000 }, { x: 100.5, y: 1100 }]);
    expect(series[1].name).toBe("cure");
  });

  it("property: inside each run x never decreases and y rises; the runs cover exactly the drawn packets' length", () => {
    const packetArb = fc.record({ start: fc.integer({ min: 0, max: 500 }), dur: fc.integer({ min: 1, max: 60 }), crew: fc.integer({ min: 0, max: 2 }) });
    fc.assert(
      fc.property(fc.array(packetArb, { minLength: 1, maxLength: 3 }), fc.array(fc.record({ at: fc.integer({ min: 0, max: 59 }), len: fc.integer({ min: 1, max: 30 }), reason: fc.constantFrom<"weather" | "closed">("weather", "closed") }), { maxLength: 6 }), (ps, pauseSpecs) => {
        const packets: TracePacket[] = ps.map((p, i) => ({ op: "mill", packet: i, crew: p.crew, start: p.start, finish: p.start + p.dur }));
        const pauses: PauseRecord[] = pauseSpecs.map((q, j) => {
          const p = packets[j % packets.length];
          return { op: "mill", packet: p.packet, crew: p.crew, start: p.start + q.at, end: p.start + q.at + q.len, reason: q.reason };
        });
        const [s] = timeDistanceSeries({ packets, pauses }, deck, ops, id);
        let covered = 0;
        let runStart: { x: number; y: number } | null = null;
        let prev: { x: number; y: number } | null = null;
        for (const pt of [...s.points, { x: 0, y: null }]) {
          if (pt.y === null) {
            if (runStart && prev) covered += prev.y - runStart.y;
            runStart = prev = null;
            continue;
          }
          const cur = { x: pt.x, y: pt.y };
          if (prev) {
            expect(cur.x).toBeGreaterThanOrEqual(prev.x - 1e-9);
            expect(cur.y).toBeGreaterThanOrEqual(prev.y - 1e-9);
          } else runStart = cur;
          prev = cur;
        }
        const expected = packets.reduce((sum, p) => {
          const [a, b] = packetStations(deck, p.packet);
          return sum + (b - a);
        }, 0);
        expect(covered).toBeCloseTo(expected, 6);
      }),
    );
  });
});
