/**
 * Capacity from the closure timeline (MODEL.md, "Traffic", "When the road is narrowed" and "Capacity").
 * Contract: `timelineClosureTraffic(scenario)` lists, for every timeline closure (the short-term closures in
 * calendar order, then one standing closure per stage), its lanes and the inputs of its capacity;
 * `capacityOf(model, direction, set)` is the capacity (veh/h) of a direction while the closures of `set`
 * (bit j = timeline closure j) stand; `timelineCapacityPieces` turns an iteration's timeline into the
 * pieces of narrowed road that `queueDelay` (./traffic) walks.
 */
import type { Scenario } from "./schema";
import { resolveStages } from "./stages";
import { popcount, type ClosureTimeline } from "./timeline";
import { hcm6WorkZone, krammesLopezCapacity, type CapacityPieces, type CompiledDirection, type TrafficModel } from "./traffic";

export interface TimelineClosureTraffic {
  kind: "short" | "standing";
  /** Lanes closed, bit mask over deck.lanes. */
  mask: number;
  /** veh/h override (a short-term closure's traffic.closures[].capacityVehPerHour, a stage's capacityVehPerHour). */
  override: number | undefined;
  workIntensity: number;
  concrete: boolean;
  night: boolean;
}

export function timelineClosureTraffic(s: Scenario): TimelineClosureTraffic[] {
  const laneBit = new Map(s.deck.lanes.map((l, i) => [l, 1 << i]));
  const mask = (lanes: string[]) => lanes.reduce((m, l) => m | (laneBit.get(l) ?? 0), 0);
  const cfg = s.traffic?.closures ?? [];
  return [
    ...s.calendar.closures.map((c): TimelineClosureTraffic => {
      const t = cfg.find((x) => x.closure === c.id);
      return { kind: "short", mask: mask(c.lanesClosed), override: t?.capacityVehPerHour, workIntensity: t?.workIntensityPcPerHourPerLane ?? 0, concrete: t?.barrier === "concrete", night: t?.night ?? false };
    }),
    ...resolveStages(s).map((st): TimelineClosureTraffic => ({ kind: "standing", mask: mask(st.standing), override: st.capacityVehPerHour, workIntensity: 0, concrete: true, night: false })),
  ];
}

/**
 * Long-term work-zone capacity per open lane, veh/h/ln, for the lane configuration `total → open`, or null
 * where the table has no value. Source: HCM 2010 Exhibit 10-14 (long-term construction zones), as reproduced
 * in FHWA-HOP-13-042 Appendix D: 2→1 1,400; 3→2 1,450; 3→1 1,450 veh/h/ln.
 */
export function hcm2010LongTermPerLane(total: number, open: number): number | null {
  if (total === 2 && open === 1) return 1400;
  if (total === 3 && (open === 2 || open === 1)) return 1450;
  return null;
}

/** Capacity (veh/h) of a direction while the timeline closures of `set` stand (MODEL.md, "Capacity"). */
export function capacityOf(m: TrafficModel, dir: CompiledDirection, set: number): number {
  const cached = dir.capBySet.get(set);
  if (cached !== undefined) return cached;
  const t = m.traffic;
  const N = dir.storageLanes;
  let closed = 0;
  let short = false;
  let shortOverride = Infinity;
  let intensity = Infinity;
  let night = false;
  let allConcrete = true;
  let standingOverride = Infinity;
  for (let j = 0, x = set; x; j++, x >>>= 1) {
    if (!(x & 1)) continue;
    const c = m.closures[j];
    closed |= c.mask;
    if (!(c.mask & dir.laneMask)) continue;
    if (c.kind === "short") {
      short = true;
      if (c.override !== undefined && c.override < shortOverride) shortOverride = c.override;
      if (c.workIntensity < intensity) intensity = c.workIntensity;
      night ||= c.night;
      allConcrete &&= c.concrete;
    } else if (c.override !== undefined && c.override < standingOverride) standingOverride = c.override;
  }
  const open = N - popcount(closed & dir.laneMask);
  let cap: number;
  if (open >= N) cap = Infinity;
  else if (short) {
    if (shortOverride < Infinity) cap = shortOverride;
    else if (t.method === "hcm6") {
      // The D/D/1 server is the queue discharge rate: once a queue stands, that is what flows.
      const h = hcm6WorkZone({ openLanes: open, totalLanes: N, cones: !allConcrete, rural: t.areaType === "rural", lateralClearanceFt: t.lateralClearanceFt, night });
      cap = open > 0 ? h.qdr * dir.fHv * open : 0;
    } else cap = krammesLopezCapacity({ basePcPerHourPerLane: t.basePcPerHourPerLane, workIntensity: intensity, fHv: dir.fHv, openLanes: open });
  } else if (standingOverride < Infinity) cap = standingOverride;
  else {
    const perLane = hcm2010LongTermPerLane(N, open);
    cap = perLane !== null ? perLane * open : krammesLopezCapacity({ basePcPerHourPerLane: t.basePcPerHourPerLane, workIntensity: 0, fHv: dir.fHv, openLanes: open });
  }
  dir.capBySet.set(set, cap);
  return cap;
}

/** The narrowed pieces of one direction in the timeline just built, with their capacity (scratch of `m`). */
export function timelineCapacityPieces(m: TrafficModel, dir: CompiledDirection, tl: ClosureTimeline): CapacityPieces {
  const out = m.scratch;
  const pc = tl.pieces(dir.select);
  if (out.starts.length < pc.n) grow(out, pc.n);
  let n = 0;
  let lastSet = -1;
  let cap = Infinity;
  for (let k = 0; k < pc.n; k++) {
    if (pc.sets[k] !== lastSet) {
      lastSet = pc.sets[k];
      cap = capacityOf(m, dir, lastSet);
    }
    if (cap === Infinity) continue;
    if (n > 0 && out.ends[n - 1] === pc.starts[k] && out.caps[n - 1] === cap) out.ends[n - 1] = pc.ends[k];
    else {
      out.starts[n] = pc.starts[k];
      out.ends[n] = pc.ends[k];
      out.caps[n] = cap;
      n++;
    }
  }
  out.n = n;
  return out;
}

/** Room for `n` pieces (out of line, so the sweep above stays small enough for V8 to inline its callers). */
function grow(out: CapacityPieces, n: number): void {
  const size = Math.max(n, 2 * out.starts.length);
  out.starts = new Float64Array(size);
  out.ends = new Float64Array(size);
  out.caps = new Float64Array(size);
}
