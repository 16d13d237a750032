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
    if (tc >= hours) {
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
  heavyShare: number;
  /** Passenger cars per vehicle, 1 + P_T (E_T − 1). */
  pcPerVeh: number;
  storageLanes: number;
  /** veh/h once every lane is open (queue discharge). */
  openCapacity: number;
  /** Per closure index: veh/h through the work zone, or Infinity when the closure narrows no lane of this direction. */
  closureCapacity: Float64Array;
}

export interface TrafficModel {
  days: number;
  /** Demand kind (index in DEMAND_KINDS) of each day since startDate. */
  dayKind: Uint8Array;
  directions: CompiledDirection[];
  jamDensity: number;
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
    return {
      id: dir.id,
      name: dir.name,
      demand,
      heavyShare: dir.heavyVehicleShare,
      pcPerVeh: 1 + dir.heavyVehicleShare * (t.truckPce - 1),
      storageLanes: dir.lanes.length,
      openCapacity: t.openRoadPcPerHourPerLane * fHv * dir.lanes.length,
      closureCapacity: closureCapacities(s, t, dir.lanes, fHv),
    };
  });
  return { days, dayKind, directions, jamDensity: t.jamDensityPcPerMiPerLane };
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
 * D/D/1 delay of one direction, veh-h, over the closure segments (several closures at once: the lowest
 * capacity holds). Time with no closure and no queue is skipped: no closure means no work-zone delay.
 * `pos` is scratch (one cursor per closure). A queue still standing at the horizon is left there.
 */
export function queueDelay(m: TrafficModel, dir: CompiledDirection, seg: ClosureSegments, pos: Int32Array, detail: QueueDetail | null): number {
  const nC = seg.counts.length;
  const horizon = 24 * m.days;
  const cap = dir.closureCapacity;
  const open = dir.openCapacity;
  pos.fill(0);
  let q = 0;
  let total = 0;
  let episodeDay = -1;
  let episodePeak = 0;
  let t = -Infinity;
  for (;;) {
    let mu = open;
    let next = Infinity;
    for (let c = 0; c < nC; c++) {
      if (cap[c] === Infinity) continue;
      const st = seg.starts[c];
      const en = seg.ends[c];
      let p = pos[c];
      while (p < seg.counts[c] && en[p] <= t) p++;
      pos[c] = p;
      if (p >= seg.counts[c]) continue;
      if (st[p] <= t) {
        if (cap[c] < mu) mu = cap[c];
        if (en[p] < next) next = en[p];
      } else if (st[p] < next) next = st[p];
    }
    if (q <= 0 && mu === open) {
      // Nothing narrows the road and no queue stands: jump to the next closure.
      if (next === Infinity || next >= horizon) break;
      t = next;
      continue;
    }
    if (t >= horizon) break;
    const hour = Math.floor(t);
    let b = hour + 1;
    if (next < b) b = next;
    if (b > horizon) b = horizon;
    const day = Math.floor(hour / 24);
    const lam = dir.demand[m.dayKind[day] * 24 + (hour - day * 24)];
    const q0 = q;
    queuePiece(q0, lam, mu, b - t, piece);
    q = piece.queue;
    total += piece.delay;
    if (detail) {
      if (q0 <= 0 && q > 0) {
        episodeDay = day;
        episodePeak = 0;
      }
      detail.delay[day] += piece.delay;
      const peakHere = q > q0 ? q : q0;
      if (peakHere > detail.peakQueue[day]) detail.peakQueue[day] = peakHere;
      if (peakHere > episodePeak) episodePeak = peakHere;
      if (piece.clearsAfter >= 0 && episodeDay >= 0 && episodePeak >= detail.episodePeak[episodeDay]) {
        detail.episodePeak[episodeDay] = episodePeak;
        detail.clearsAt[episodeDay] = t + piece.clearsAfter;
      }
    }
    t = b;
  }
  return total;
}
