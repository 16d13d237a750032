/**
 * The traffic model (MODEL.md, "Traffic"): hourly demand by demand day type, work-zone capacity under each
 * closure, and deterministic (D/D/1) queuing over the simulated closure time. Contract:
 * - `compileTraffic` does all per-scenario work once (day kinds over the horizon, demand profiles, the
 *   capacity of every closure for every direction), so an iteration only walks its closure segments.
 * - `queueDelay` runs D/D/1 exactly over piecewise-constant demand (one rate per clock hour) and capacity
 *   (constant between closure segment ends), only over closure time and the time a queue remains.
 * Units: veh/h (demand, capacity), pc/h/ln (capacity method inputs), veh (queues), veh-h (delay), miles.
 */
import { civilFromDays, parseIsoDate, weekdayOfDayNumber } from "./dates";
import { federalHolidays } from "./holidays";
import type { Scenario, Traffic } from "./schema";

/** Demand day kinds: the index of the profile in `demand` (24 values each). */
export const DEMAND_KINDS = ["weekday", "friday", "saturday", "sunday", "holidayPeak"] as const;
export type DemandKind = (typeof DEMAND_KINDS)[number];

/**
 * Heavy-vehicle adjustment f_HV = 1 / (1 + P_T (E_T − 1)).
 * Source: Highway Capacity Manual (basic freeway segments), as used by Krammes & Lopez (1994); REFERENCES.md.
 */
export function heavyVehicleFactor(share: number, truckPce: number): number {
  return 1 / (1 + share * (truckPce - 1));
}

/**
 * Short-term work-zone capacity, veh/h: c = (1,600 + I − R) · f_HV · N.
 * Source: Krammes & Lopez (1994), TRR 1442 — base 1,600 pc/h/ln found (HCM 2000), the full formula from
 * memory (REFERENCES.md, "Work-zone capacity and queues"). I = work intensity (±160 pc/h/ln), R = ramp
 * adjustment (0 here: no ramp inside the zone), N = open lanes.
 */
export function krammesLopezCapacity(p: { basePcPerHourPerLane?: number; workIntensity: number; ramps?: number; fHv: number; openLanes: number }): number {
  return ((p.basePcPerHourPerLane ?? 1600) + p.workIntensity - (p.ramps ?? 0)) * p.fHv * p.openLanes;
}

/**
 * HCM 6th edition work-zone queue discharge rate and capacity, pc/h/ln (Eqs. 10-7 to 10-9).
 * Source: HCM 6th ed. (NCHRP 03-107; Yeom et al., TRR 2485, 2015), REFERENCES.md:
 * LCSI = 1 / (OR · N_open), OR = open / total lanes;
 * QDR = 2,093 − 154·LCSI − 194·f_Br − 179·f_AT + 9·f_LAT − 59·f_DN; c = QDR / (1 − α), α = 0.134.
 */
export function hcm6WorkZone(p: { openLanes: number; totalLanes: number; cones: boolean; rural: boolean; lateralClearanceFt: number; night: boolean }): { lcsi: number; qdr: number; capacity: number } {
  const lcsi = 1 / ((p.openLanes / p.totalLanes) * p.openLanes);
  const qdr = 2093 - 154 * lcsi - 194 * (p.cones ? 1 : 0) - 179 * (p.rural ? 1 : 0) + 9 * p.lateralClearanceFt - 59 * (p.night ? 1 : 0);
  return { lcsi, qdr, capacity: qdr / (1 - 0.134) };
}

/**
 * Queue length, miles: vehicles → passenger cars (× (1 + P_T (E_T − 1))) at jam density over the lanes the
 * queue stores in. Source: jam density 190 pc/mi/ln, HCM 7th ed. ch. 25 (REFERENCES.md).
 */
export function queueMiles(vehicles: number, jamPcPerMiPerLane: number, storageLanes: number, pcPerVeh = 1): number {
  return (vehicles * pcPerVeh) / (jamPcPerMiPerLane * storageLanes);
}

export interface QueuePiece {
  /** Queue at the end of the piece, veh. */
  queue: number;
  /** Area under the queue over the piece = delay, veh-h. */
  delay: number;
  /** Time within the piece (h from its start) the queue reaches zero, or −1 if it does not clear in it. */
  clearsAfter: number;
}

/**
 * One D/D/1 piece: arrivals λ and service μ (veh/h) constant for `hours`, starting with `queue` veh.
 * Source: deterministic queuing (REFERENCES.md, "computed"): the queue grows at λ − μ while positive;
 * delay is the area between the cumulative arrival and departure curves.
 */
export function queuePiece(queue: number, arrivals: number, service: number, hours: number, out: QueuePiece): QueuePiece {
  const net = arrivals - service;
  if (net >= 0) {
    const q1 = queue + net * hours;
    out.queue = q1;
    out.delay = ((queue + q1) / 2) * hours;
    out.clearsAfter = -1;
  } else if (queue <= 0) {
    out.queue = 0;
    out.delay = 0;
    out.clearsAfter = -1;
  } else {
    const tc = queue / -net;
    if (tc > hours) {
      const q1 = queue + net * hours;
      out.queue = q1;
      out.delay = ((queue + q1) / 2) * hours;
      out.clearsAfter = -1;
    } else {
      out.queue = 0;
      out.delay = (queue * tc) / 2;
      out.clearsAfter = tc;
    }
  }
  return out;
}

export interface CompiledDirection {
  id: string;
  name: string;
  /** demand[kind · 24 + hour], veh/h. */
  demand: Float64Array;
  /** Demand of every clock hour since 00:00 of startDate over the horizon, veh/h (hourDemand[⌊t⌋]). */
  hourDemand: Float64Array;
  /** Indices of the closures that narrow this direction. */
  narrowing: Int32Array;
  heavyShare: number;
  /** Passenger cars per vehicle, 1 + P_T (E_T − 1). */
  pcPerVeh: number;
  storageLanes: number;
  /** veh/h once every lane is open (queue discharge). */
  openCapacity: number;
  /** Per closure index: veh/h through the work zone, or Infinity when the closure narrows no lane of this direction. */
  closureCapacity: Float64Array;
  /**
   * Per closure index (null where it does not narrow): nextOver[h] = the first clock hour ≥ h whose demand
   * exceeds the closure's capacity (24 · days if none), so the walk jumps over hours that add no queue.
   * Optional: without it the walk steps hour by hour (same result).
   */
  nextOver?: (Int32Array | null)[];
}

export interface TrafficModel {
  days: number;
  /** Demand kind (index in DEMAND_KINDS) of each day since startDate. */
  dayKind: Uint8Array;
  directions: CompiledDirection[];
  jamDensity: number;
  /** Scratch of `queueDelay`: the merged capacity pieces of one direction. */
  scratch: { starts: Float64Array; ends: Float64Array; caps: Float64Array; pos: Int32Array };
}

/**
 * Holiday-peak days: each observed federal holiday (and blackout date), extended like a stand-down block over
 * the adjacent weekend (and the Friday after a Thursday holiday), plus the day before the block (the
 * getaway day). Peak traffic does not depend on whether the contract observes the holidays.
 */
function holidayPeakDays(s: Scenario, startDay: number, days: number): Set<number> {
  const y0 = civilFromDays(startDay).y;
  const y1 = civilFromDays(startDay + days).y;
  const holidays: number[] = [];
  for (let y = y0 - 1; y <= y1 + 1; y++) for (const h of federalHolidays(y)) holidays.push(parseIsoDate(h.observed));
  for (const b of s.calendar.holidays.blackoutDates) holidays.push(parseIsoDate(b));
  const weekend = (z: number) => {
    const w = weekdayOfDayNumber(z);
    return w === 0 || w === 6;
  };
  const out = new Set<number>();
  for (const h of holidays) {
    let first = h;
    let last = h;
    while (weekend(first - 1)) first--;
    if (weekdayOfDayNumber(h) === 4) last = h + 1;
    while (weekend(last + 1)) last++;
    for (let z = first - 1; z <= last; z++) out.add(z);
  }
  return out;
}

export function demandKindOf(z: number, peak: Set<number>): number {
  if (peak.has(z)) return 4;
  const w = weekdayOfDayNumber(z);
  return w === 5 ? 1 : w === 6 ? 2 : w === 0 ? 3 : 0;
}

/** Capacity of each closure for one direction (veh/h); Infinity where the closure leaves the direction alone. */
function closureCapacities(s: Scenario, t: Traffic, lanes: string[], fHv: number): Float64Array {
  const out = new Float64Array(s.calendar.closures.length);
  s.calendar.closures.forEach((c, ci) => {
    const closed = lanes.filter((l) => c.lanesClosed.includes(l)).length;
    const cfg = t.closures.find((x) => x.closure === c.id);
    if (closed === 0) out[ci] = Infinity;
    else if (cfg?.capacityVehPerHour !== undefined) out[ci] = cfg.capacityVehPerHour;
    else {
      const open = lanes.length - closed;
      if (t.method === "hcm6") {
        // The D/D/1 server is the queue discharge rate: once a queue stands, that is what flows.
        const h = hcm6WorkZone({ openLanes: open, totalLanes: lanes.length, cones: (cfg?.barrier ?? "cones") === "cones", rural: t.areaType === "rural", lateralClearanceFt: t.lateralClearanceFt, night: cfg?.night ?? false });
        out[ci] = h.qdr * fHv * open;
      } else {
        out[ci] = krammesLopezCapacity({ basePcPerHourPerLane: t.basePcPerHourPerLane, workIntensity: cfg?.workIntensityPcPerHourPerLane ?? 0, fHv, openLanes: open });
      }
    }
  });
  return out;
}

/** Null when the scenario has no traffic section or no direction: then no delay is computed at all. */
export function compileTraffic(s: Scenario, startDay: number, days: number): TrafficModel | null {
  const t = s.traffic;
  if (!t || t.directions.length === 0) return null;
  const peak = holidayPeakDays(s, startDay, days);
  const dayKind = new Uint8Array(days + 1);
  for (let d = 0; d <= days; d++) dayKind[d] = demandKindOf(startDay + d, peak);
  const directions = t.directions.map((dir): CompiledDirection => {
    const demand = new Float64Array(DEMAND_KINDS.length * 24);
    DEMAND_KINDS.forEach((k, ki) => demand.set(dir.demand[k], ki * 24));
    const fHv = heavyVehicleFactor(dir.heavyVehicleShare, t.truckPce);
    const hourDemand = new Float64Array(24 * days);
    for (let d = 0; d < days; d++) hourDemand.set(demand.subarray(dayKind[d] * 24, dayKind[d] * 24 + 24), 24 * d);
    const closureCapacity = closureCapacities(s, t, dir.lanes, fHv);
    const narrowing: number[] = [];
    closureCapacity.forEach((c, i) => {
      if (c !== Infinity) narrowing.push(i);
    });
    const nextOver = Array.from(closureCapacity, (cap) => (cap === Infinity ? null : nextHourOver(hourDemand, cap)));
    return {
      id: dir.id,
      name: dir.name,
      demand,
      hourDemand,
      narrowing: Int32Array.from(narrowing),
      heavyShare: dir.heavyVehicleShare,
      pcPerVeh: 1 + dir.heavyVehicleShare * (t.truckPce - 1),
      storageLanes: dir.lanes.length,
      openCapacity: t.openRoadPcPerHourPerLane * fHv * dir.lanes.length,
      closureCapacity,
      nextOver,
    };
  });
  return { days, dayKind, directions, jamDensity: t.jamDensityPcPerMiPerLane, scratch: { starts: new Float64Array(256), ends: new Float64Array(256), caps: new Float64Array(256), pos: new Int32Array(s.calendar.closures.length) } };
}

function nextHourOver(hourDemand: Float64Array, cap: number): Int32Array {
  const n = hourDemand.length;
  const out = new Int32Array(n + 1);
  out[n] = n;
  for (let h = n - 1; h >= 0; h--) out[h] = hourDemand[h] > cap ? h : out[h + 1];
  return out;
}

/** Closure time of one iteration: per closure, chronological disjoint segments (hours since startDate). */
export interface ClosureSegments {
  starts: Float64Array[];
  ends: Float64Array[];
  counts: Int32Array;
}

/** Per-day detail for the representative iteration (arrays over days since startDate). */
export interface QueueDetail {
  delay: Float64Array;
  peakQueue: Float64Array;
  /** When the day's longest queue episode (by the day it began) cleared, h since startDate; NaN if none. */
  clearsAt: Float64Array;
  episodePeak: Float64Array;
}

export function newQueueDetail(days: number): QueueDetail {
  return { delay: new Float64Array(days), peakQueue: new Float64Array(days), clearsAt: new Float64Array(days).fill(NaN), episodePeak: new Float64Array(days) };
}

const piece: QueuePiece = { queue: 0, delay: 0, clearsAfter: -1 };

/**
 * The closure time that narrows one direction as disjoint chronological pieces with their capacity (where
 * closures overlap, the lowest capacity holds). Returns the number of pieces in `m.scratch`.
 */
function capacityPieces(m: TrafficModel, dir: CompiledDirection, seg: ClosureSegments): number {
  const sc = m.scratch;
  const rel = dir.narrowing;
  const cap = dir.closureCapacity;
  if (rel.length === 1) {
    // One closure: its union is already disjoint and chronological.
    const c = rel[0];
    const n = seg.counts[c];
    grow(sc, n);
    sc.starts.set(seg.starts[c].subarray(0, n));
    sc.ends.set(seg.ends[c].subarray(0, n));
    sc.caps.fill(cap[c], 0, n);
    return n;
  }
  // The current segment of each narrowing closure (j indexes `rel`) in local scratch, so the sweep reads
  // flat arrays; a spent closure gets start = end = Infinity, which never covers t nor bounds `next`.
  const k = rel.length;
  if (headS.length < k) {
    headS = new Float64Array(k);
    headE = new Float64Array(k);
    headP = new Int32Array(k);
  }
  for (let j = 0; j < k; j++) {
    const c = rel[j];
    headP[j] = 0;
    headS[j] = seg.counts[c] > 0 ? seg.starts[c][0] : Infinity;
    headE[j] = seg.counts[c] > 0 ? seg.ends[c][0] : Infinity;
  }
  let n = 0;
  let t = -Infinity;
  for (;;) {
    let mu = Infinity;
    let next = Infinity;
    for (let j = 0; j < k; j++) {
      if (headE[j] <= t) {
        const c = rel[j];
        const en = seg.ends[c];
        const count = seg.counts[c];
        let p = headP[j] + 1;
        while (p < count && en[p] <= t) p++;
        headP[j] = p;
        headS[j] = p < count ? seg.starts[c][p] : Infinity;
        headE[j] = p < count ? en[p] : Infinity;
      }
      const st = headS[j];
      if (st <= t) {
        const cj = cap[rel[j]];
        if (cj < mu) mu = cj;
        if (headE[j] < next) next = headE[j];
      } else if (st < next) next = st;
    }
    if (next === Infinity) break;
    if (mu < Infinity) {
      if (n > 0 && sc.ends[n - 1] === t && sc.caps[n - 1] === mu) sc.ends[n - 1] = next;
      else {
        grow(sc, n + 1);
        sc.starts[n] = t;
        sc.ends[n] = next;
        sc.caps[n] = mu;
        n++;
      }
    }
    t = next;
  }
  return n;
}

let headS = new Float64Array(4);
let headE = new Float64Array(4);
let headP = new Int32Array(4);

function grow(sc: TrafficModel["scratch"], n: number): void {
  if (n <= sc.starts.length) return;
  const size = Math.max(n, 2 * sc.starts.length);
  for (const k of ["starts", "ends", "caps"] as const) {
    const a = new Float64Array(size);
    a.set(sc[k]);
    sc[k] = a;
  }
}

/** Queue state carried along one direction's walk. */
interface Walk {
  q: number;
  total: number;
  episodeDay: number;
  episodePeak: number;
}

/**
 * D/D/1 from `a` to `b` at service rate `mu`, one piece per clock hour (demand is constant inside an hour).
 * With `untilEmpty` the walk stops as soon as the queue is gone (the road is open again). `over`, when
 * given, is the `nextOver` table of capacity `mu`: with no queue, the hours up to the next one whose demand
 * exceeds `mu` would each add nothing, so the walk jumps to it. Returns the time reached.
 */
function walk(dir: CompiledDirection, w: Walk, a: number, b: number, mu: number, untilEmpty: boolean, detail: QueueDetail | null, over: Int32Array | null): number {
  const hd = dir.hourDemand;
  let t = a;
  while (t < b) {
    const hour = Math.floor(t);
    const hb = hour + 1 < b ? hour + 1 : b;
    const lam = hd[hour];
    const q0 = w.q;
    if (q0 <= 0) {
      if (untilEmpty) return t;
      if (lam <= mu) {
        // The common case: no queue and demand within capacity — nothing to add, up to the next hour over.
        if (over) {
          const h = over[hour];
          t = h < b ? h : b;
        } else t = hb;
        continue;
      }
    }
    queuePiece(q0, lam, mu, hb - t, piece);
    w.q = piece.queue;
    w.total += piece.delay;
    if (detail) record(detail, w, Math.floor(hour / 24), q0, t);
    if (untilEmpty && piece.clearsAfter >= 0) return t + piece.clearsAfter;
    t = hb;
  }
  return t;
}

function record(detail: QueueDetail, w: Walk, day: number, q0: number, t: number): void {
  const q = w.q;
  if (q0 <= 0 && q > 0) {
    w.episodeDay = day;
    w.episodePeak = 0;
  }
  detail.delay[day] += piece.delay;
  const peakHere = q > q0 ? q : q0;
  if (peakHere > detail.peakQueue[day]) detail.peakQueue[day] = peakHere;
  if (peakHere > w.episodePeak) w.episodePeak = peakHere;
  if (piece.clearsAfter >= 0 && w.episodeDay >= 0 && w.episodePeak >= detail.episodePeak[w.episodeDay]) {
    detail.episodePeak[w.episodeDay] = w.episodePeak;
    detail.clearsAt[w.episodeDay] = t + piece.clearsAfter;
  }
}

/** The `nextOver` table of a piece's capacity: that of a narrowing closure with exactly this capacity. */
function overTable(dir: CompiledDirection, mu: number): Int32Array | null {
  const rel = dir.narrowing;
  const tables = dir.nextOver;
  if (tables) for (let j = 0; j < rel.length; j++) if (dir.closureCapacity[rel[j]] === mu) return tables[rel[j]];
  return null;
}

/**
 * D/D/1 delay of one direction, veh-h, over the closure segments of one iteration. Outside closure time the
 * road is open (`openCapacity`) and only a standing queue is walked: no closure means no work-zone delay.
 * A queue still standing at the horizon is left there.
 */
export function queueDelay(m: TrafficModel, dir: CompiledDirection, seg: ClosureSegments, detail: QueueDetail | null): number {
  if (dir.narrowing.length === 0) return 0;
  const n = capacityPieces(m, dir, seg);
  const { starts, ends, caps } = m.scratch;
  const horizon = 24 * m.days;
  const w: Walk = { q: 0, total: 0, episodeDay: -1, episodePeak: 0 };
  let t = 0;
  for (let i = 0; i < n; i++) {
    const a = starts[i];
    if (a >= horizon) break;
    if (w.q > 0 && t < a) walk(dir, w, t, a, dir.openCapacity, true, detail, null);
    t = walk(dir, w, a, ends[i] < horizon ? ends[i] : horizon, caps[i], false, detail, overTable(dir, caps[i]));
  }
  if (w.q > 0) walk(dir, w, t, horizon, dir.openCapacity, true, detail, null);
  return w.total;
}
