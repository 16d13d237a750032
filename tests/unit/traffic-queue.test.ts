/**
 * The traffic model's D/D/1 queuing, capacity formulas and queue length against hand-worked and published
 * values, plus properties of the walk over closure segments (sim/traffic.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { hcm6WorkZone, heavyVehicleFactor, krammesLopezCapacity, newQueueDetail, queueDelay, queueMiles, type CapacityPieces, type CompiledDirection, type TrafficModel } from "../../sim/traffic";

type Segments = [number, number][][];

/**
 * A direction with a given per-hour demand (padded with `rest`) and open-road capacity; `on(lists)` turns
 * closure segments (list i at capacity caps[i]) into the capacity pieces `queueDelay` walks, the lowest
 * capacity holding where segments overlap (what the closure timeline gives for stacked closures).
 */
function model(demand: number[], caps: number[], open: number, days = 4, rest = 0): { m: TrafficModel; dir: CompiledDirection; on: (lists: Segments) => CapacityPieces } {
  const hourDemand = new Float64Array(24 * days).fill(rest);
  hourDemand.set(demand);
  const dir: CompiledDirection = {
    id: "d", name: "d", demand: new Float64Array(120), hourDemand, heavyShare: 0, pcPerVeh: 1, storageLanes: 1,
    openCapacity: open, laneMask: 1, fHv: 1, select: 1, capBySet: new Map(), nextOver: new Map(), lastMu: NaN, lastOver: null,
  };
  const scratch: CapacityPieces = { starts: new Float64Array(4), ends: new Float64Array(4), caps: new Float64Array(4), n: 0 };
  const m = { days, dayKind: new Uint8Array(days + 1), directions: [dir], jamDensity: 190, closures: [], traffic: {}, scratch, walkState: { q: 0, total: 0, episodeDay: -1, episodePeak: 0 } } as unknown as TrafficModel;
  const on = (lists: Segments): CapacityPieces => {
    const cuts = [...new Set(lists.flat().flat())].sort((a, b) => a - b);
    const starts: number[] = [];
    const ends: number[] = [];
    const cs: number[] = [];
    for (let k = 0; k + 1 < cuts.length; k++) {
      const mid = (cuts[k] + cuts[k + 1]) / 2;
      let mu = Infinity;
      lists.forEach((l, i) => l.forEach(([a, b]) => (a <= mid && mid < b ? (mu = Math.min(mu, caps[i])) : 0)));
      if (mu < Infinity) {
        starts.push(cuts[k]);
        ends.push(cuts[k + 1]);
        cs.push(mu);
      }
    }
    return { starts: Float64Array.from(starts), ends: Float64Array.from(ends), caps: Float64Array.from(cs), n: starts.length };
  };
  return { m, dir, on };
}

describe("D/D/1 queuing over closure segments", () => {
  it("hand-worked bottleneck: 1,800 veh/h against 1,400 for 2 h, then 900 veh/h", () => {
    // Source: SOURCES.md "Work-zone capacity and queues" (deterministic queuing, computed):
    // the queue grows at 1,800 − 1,400 = 400 veh/h for 2 h → 800 veh; it then shrinks at 1,400 − 900 = 500 veh/h,
    // so it clears 800 / 500 = 1.6 h after demand drops (t = 3.6 h). Delay = area between the cumulative
    // arrival and departure curves = triangle ½ · 800 veh · 3.6 h = 1,440 veh-h.
    const { m, dir, on } = model([1800, 1800], [1400], 10_000, 4, 900);
    const detail = newQueueDetail(4);
    const delay = queueDelay(m, dir, on([[[0, 10]]]), detail);
    expect(delay).toBeCloseTo(1440, 9);
    expect(detail.peakQueue[0]).toBeCloseTo(800, 9);
    expect(detail.clearsAt[0]).toBeCloseTo(3.6, 9);
  });

  it("textbook pattern: 6/min then 2/min, service 4/min starting with 30 queued — clears at 40 min, 1,100 veh-min", () => {
    // Source: SOURCES.md (textbook pattern). Minutes stand in for hours here. Arrivals 6/min from 0 with no
    // service until 30 are queued (t = 5 min: a first closure with capacity 0), then service 4/min (a second
    // closure) while arrivals stay 6/min to t = 15 (queue 30 + 2·10 = 50), then 2/min: the queue falls at
    // 2/min and clears at 15 + 50/2 = 40 min. Area: ½·30·5 + (30 + 50)/2·10 + ½·50·25 = 75 + 400 + 625 = 1,100.
    const { m, dir, on } = model(new Array(15).fill(6), [0, 4], 1_000, 4, 2);
    const detail = newQueueDetail(4);
    const delay = queueDelay(m, dir, on([[[0, 5]], [[5, 90]]]), detail);
    expect(delay).toBeCloseTo(1100, 9);
    expect(detail.peakQueue[0]).toBeCloseTo(50, 9);
    expect(detail.clearsAt[0]).toBeCloseTo(40, 9);
  });

  it("a queue left when the closure ends discharges at the open-road capacity", () => {
    // 2,000 veh/h against 1,600 from 0 to 3 h → 1,200 veh; then 4,000 − 2,000 = 2,000 veh/h → clears 0.6 h
    // later. Delay = ½·1,200·3 + ½·1,200·0.6 = 1,800 + 360 = 2,160 veh-h (worked by hand).
    const { m, dir, on } = model([], [1600], 4000, 4, 2000);
    const detail = newQueueDetail(4);
    expect(queueDelay(m, dir, on([[[0, 3]]]), detail)).toBeCloseTo(2160, 9);
    expect(detail.clearsAt[0]).toBeCloseTo(3.6, 9);
  });

  it("overlapping closures: the lower capacity holds", () => {
    // [0, 2) at 1,500 and [1, 3) at 1,000 with 1,800 veh/h: 300·1 h, then 800·2 h → 1,900 veh at 3 h;
    // open road 3,800: clears 1,900 / 2,000 = 0.95 h later. Area: ½·300·1 + (300 + 1,900)/2·2 + ½·1,900·0.95.
    const { m, dir, on } = model([], [1500, 1000], 3800, 4, 1800);
    const expected = 0.5 * 300 + 1100 * 2 + 0.5 * 1900 * 0.95;
    expect(queueDelay(m, dir, on([[[0, 2]], [[1, 3]]]), null)).toBeCloseTo(expected, 9);
  });
});

describe("capacity and queue length against their sources", () => {
  it("Krammes & Lopez: I = −160, 10 % trucks at E_T = 1.5, one open lane → 1,371 veh/h", () => {
    // Source: Krammes & Lopez (1994), TRR 1442 (formula from memory; base 1,600 from HCM 2000), SOURCES.md.
    const fHv = heavyVehicleFactor(0.1, 1.5);
    expect(fHv).toBeCloseTo(0.952, 3);
    expect(Math.round(krammesLopezCapacity({ workIntensity: -160, fHv, openLanes: 1 }))).toBe(1371);
  });

  it("HCM 6th ed.: 3 → 2 lanes at night, cones, urban, 6 ft lateral clearance → QDR 1,778.5, capacity 2,053.7 pc/h/ln", () => {
    // Source: HCM 6th edition Eqs. 10-7 to 10-9 (NCHRP 03-107), worked value in SOURCES.md.
    const h = hcm6WorkZone({ openLanes: 2, totalLanes: 3, cones: true, rural: false, lateralClearanceFt: 6, night: true });
    expect(h.lcsi).toBeCloseTo(0.75, 12);
    expect(h.qdr).toBeCloseTo(1778.5, 9);
    expect(h.capacity).toBeCloseTo(2053.7, 1);
    // Source: same — LCSI for 2 → 1 lanes is 2.00.
    expect(hcm6WorkZone({ openLanes: 1, totalLanes: 2, cones: true, rural: false, lateralClearanceFt: 6, night: false }).lcsi).toBe(2);
  });

  it("800 queued vehicles at 190 pc/mi/ln in one lane → 4.21 mi", () => {
    // Source: jam density 190 pc/mi/ln, HCM 7th ed. ch. 25 (SOURCES.md); 800 / 190 = 4.21 mi.
    expect(queueMiles(800, 190, 1)).toBeCloseTo(4.21, 2);
    // Trucks take more room: 10 % at E_T = 1.5 → 1.05 pc per vehicle.
    expect(queueMiles(800, 190, 1, 1.05)).toBeCloseTo(4.42, 2);
  });
});

describe("properties of the walk", () => {
  const segArb = fc
    .array(fc.tuple(fc.integer({ min: 0, max: 80 }), fc.integer({ min: 1, max: 12 })), { maxLength: 6 })
    .map((l) => {
      // Sorted, disjoint segments from (start, length) pairs.
      const out: [number, number][] = [];
      let t = 0;
      for (const [gap, len] of l) {
        const a = t + gap;
        out.push([a, a + len]);
        t = a + len;
      }
      return out;
    });
  const demandArb = fc.array(fc.integer({ min: 0, max: 4000 }), { minLength: 24 * 6, maxLength: 24 * 6 });

  it("no closure ⇒ no delay, whatever the demand", () => {
    fc.assert(
      fc.property(demandArb, (demand) => {
        const { m, dir, on } = model(demand, [1000], 1500, 6);
        return queueDelay(m, dir, on([[]]), null) === 0;
      }),
    );
  });

  it("more capacity never gives more delay", () => {
    fc.assert(
      fc.property(demandArb, segArb, fc.integer({ min: 500, max: 3000 }), fc.integer({ min: 1, max: 1500 }), (demand, segs, cap, extra) => {
        const a = model(demand, [cap], 4500, 6);
        const b = model(demand, [cap + extra], 4500 + extra, 6);
        return queueDelay(b.m, b.dir, b.on([segs]), null) <= queueDelay(a.m, a.dir, a.on([segs]), null) + 1e-6;
      }),
    );
  });

  it("delay is zero on days whose demand stays within capacity and that start with no queue", () => {
    const lowDemand = fc.array(fc.integer({ min: 0, max: 2000 }), { minLength: 24 * 6, maxLength: 24 * 6 });
    fc.assert(
      fc.property(lowDemand, segArb, fc.integer({ min: 0, max: 5 }), (demand, segs, quietDay) => {
        // The quiet day's demand is at most 900 veh/h (capacity 1,000). It starts with no queue: either it is
        // day 0, or the day before has no closure and no demand, and the open road (4,500 veh/h · 24 h =
        // 108,000 veh) drains any earlier queue (at most (2,000 − 1,000) veh/h · 24 h · 4 days = 96,000 veh).
        const d = demand.slice();
        for (let h = 0; h < 24; h++) d[24 * quietDay + h] = Math.min(d[24 * quietDay + h], 900);
        let kept = segs;
        if (quietDay > 0) {
          for (let h = 0; h < 24; h++) d[24 * (quietDay - 1) + h] = 0;
          const a = 24 * (quietDay - 1);
          kept = segs.flatMap(([s, e]): [number, number][] => (e <= a || s >= a + 24 ? [[s, e]] : [s < a ? [s, a] : null, e > a + 24 ? [a + 24, e] : null].filter((x): x is [number, number] => x !== null)));
        }
        const { m, dir, on } = model(d, [1000], 4500, 6);
        const detail = newQueueDetail(6);
        queueDelay(m, dir, on([kept]), detail);
        return detail.delay[quietDay] === 0 && detail.peakQueue[quietDay] === 0;
      }),
      { numRuns: 300 },
    );
  });
});
