/**
 * The traffic model (MODEL.md, "Traffic"): hourly demand by demand day type, the capacity formulas, and
 * deterministic (D/D/1) queuing over the pieces of narrowed road of an iteration. Contract:
 * - `compileTraffic` does all per-scenario work once (day kinds over the horizon, demand profiles, which
 *   timeline closures can narrow each direction); the capacity of what stands in each piece is read from the
 *   closure timeline by ./traffic-capacity;
 * - `queueDelay` runs D/D/1 exactly over piecewise-constant demand (one rate per clock hour) and capacity
 *   (constant inside a piece), only over narrowed time and the time a queue remains.
 * Units: veh/h (demand, capacity), pc/h/ln (capacity method inputs), veh (queues), veh-h (delay), miles.
 */
import { civilFromDays, parseIsoDate, weekdayOfDayNumber } from "./dates";
import { federalHolidays } from "./holidays";
import { lastVehicleDelayMinutes } from "./queue-limit";
import type { Scenario, Traffic } from "./schema";
import { timelineClosureTraffic, type TimelineClosureTraffic } from "./traffic-capacity";

/** Demand day kinds: the index of the profile in `demand` (24 values each). */
export const DEMAND_KINDS = ["weekday", "friday", "saturday", "sunday", "holidayPeak"] as const;
export type DemandKind = (typeof DEMAND_KINDS)[number];

/**
 * Heavy-vehicle adjustment f_HV = 1 / (1 + P_T (E_T − 1)).
 * Source: Highway Capacity Manual (basic freeway segments), as used by Krammes & Lopez (1994); SOURCES.md.
 */
export function heavyVehicleFactor(share: number, truckPce: number): number {
  return 1 / (1 + share * (truckPce - 1));
}

/**
 * Short-term work-zone capacity, veh/h: c = (1,600 + I − R) · f_HV · N.
 * Source: Krammes & Lopez (1994), TRR 1442 — base 1,600 pc/h/ln found (HCM 2000), the full formula from
 * memory (SOURCES.md, "Work-zone capacity and queues"). I = work intensity (±160 pc/h/ln), R = ramp
 * adjustment (0 here: no ramp inside the zone), N = open lanes.
 */
export function krammesLopezCapacity(p: { basePcPerHourPerLane?: number; workIntensity: number; ramps?: number; fHv: number; openLanes: number }): number {
  return ((p.basePcPerHourPerLane ?? 1600) + p.workIntensity - (p.ramps ?? 0)) * p.fHv * p.openLanes;
}

/**
 * HCM 6th edition work-zone queue discharge rate and capacity, pc/h/ln (Eqs. 10-7 to 10-9).
 * Source: HCM 6th ed. (NCHRP 03-107; Yeom et al., TRR 2485, 2015), SOURCES.md:
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
 * queue stores in. Source: jam density 190 pc/mi/ln, HCM 7th ed. ch. 25 (SOURCES.md).
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
 * Source: deterministic queuing (SOURCES.md, "computed"): the queue grows at λ − μ while positive;
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
  heavyShare: number;
  /** Passenger cars per vehicle, 1 + P_T (E_T − 1). */
  pcPerVeh: number;
  storageLanes: number;
  /** veh/h once every lane is open (queue discharge). */
  openCapacity: number;
  /** The direction's lanes as a bit mask over deck.lanes. */
  laneMask: number;
  /** Heavy-vehicle factor f_HV. */
  fHv: number;
  /** Timeline closures (bit j) whose lanes include one of this direction's: only they can narrow it. */
  select: number;
  /** Capacity (veh/h) by the set of timeline closures standing, filled as sets are met (./traffic-capacity). */
  capBySet: Map<number, number>;
  /**
   * Per capacity value: nextOver[h] = the first clock hour ≥ h whose demand exceeds it (24 · days if none), so
   * the walk jumps over hours that add no queue. Built when a capacity is first met.
   */
  nextOver: Map<number, Int32Array>;
  /** The capacity last looked up in `nextOver` and its table: consecutive pieces mostly share one. */
  lastMu: number;
  lastOver: Int32Array | null;
}

export interface TrafficModel {
  days: number;
  /** Demand kind (index in DEMAND_KINDS) of each day since startDate. */
  dayKind: Uint8Array;
  directions: CompiledDirection[];
  jamDensity: number;
  /** What each timeline closure does to capacity (./traffic-capacity). */
  closures: TimelineClosureTraffic[];
  traffic: Traffic;
  /** Scratch of the capacity pieces of one direction. */
  scratch: CapacityPieces;
  /** Scratch of the queue state along one direction's walk (`queueDelay`). */
  walkState: Walk;
}

/** Disjoint chronological pieces of narrowed road with their capacity, veh/h. */
export interface CapacityPieces {
  starts: Float64Array;
  ends: Float64Array;
  caps: Float64Array;
  n: number;
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
/** Null when the scenario has no traffic section or no direction: then no delay is computed at all. */
export function compileTraffic(s: Scenario, startDay: number, days: number): TrafficModel | null {
  const t = s.traffic;
  if (!t || t.directions.length === 0) return null;
  const peak = holidayPeakDays(s, startDay, days);
  const dayKind = new Uint8Array(days + 1);
  for (let d = 0; d <= days; d++) dayKind[d] = demandKindOf(startDay + d, peak);
  const closures = timelineClosureTraffic(s);
  const laneBit = new Map(s.deck.lanes.map((l, i) => [l, 1 << i]));
  const directions = t.directions.map((dir): CompiledDirection => {
    const demand = new Float64Array(DEMAND_KINDS.length * 24);
    DEMAND_KINDS.forEach((k, ki) => demand.set(dir.demand[k], ki * 24));
    const fHv = heavyVehicleFactor(dir.heavyVehicleShare, t.truckPce);
    const hourDemand = new Float64Array(24 * days);
    for (let d = 0; d < days; d++) hourDemand.set(demand.subarray(dayKind[d] * 24, dayKind[d] * 24 + 24), 24 * d);
    const laneMask = dir.lanes.reduce((m, l) => m | (laneBit.get(l) ?? 0), 0);
    let select = 0;
    closures.forEach((c, j) => {
      if (c.mask & laneMask) select |= 1 << j;
    });
    return {
      id: dir.id,
      name: dir.name,
      demand,
      hourDemand,
      heavyShare: dir.heavyVehicleShare,
      pcPerVeh: 1 + dir.heavyVehicleShare * (t.truckPce - 1),
      storageLanes: dir.lanes.length,
      openCapacity: t.openRoadPcPerHourPerLane * fHv * dir.lanes.length,
      laneMask,
      fHv,
      select,
      capBySet: new Map(),
      nextOver: new Map(),
      lastMu: NaN,
      lastOver: null,
    };
  });
  return { days, dayKind, directions, jamDensity: t.jamDensityPcPerMiPerLane, closures, traffic: t, scratch: { starts: new Float64Array(256), ends: new Float64Array(256), caps: new Float64Array(256), n: 0 }, walkState: { q: 0, total: 0, episodeDay: -1, episodePeak: 0 } };
}

/** nextOver table of one capacity: the first clock hour ≥ h whose demand exceeds it. */
export function nextHourOver(hourDemand: Float64Array, cap: number): Int32Array {
  const n = hourDemand.length;
  const out = new Int32Array(n + 1);
  out[n] = n;
  for (let h = n - 1; h >= 0; h--) out[h] = hourDemand[h] > cap ? h : out[h + 1];
  return out;
}

/** Per-day detail for the representative iteration (arrays over days since startDate). */
export interface QueueDetail {
  delay: Float64Array;
  peakQueue: Float64Array;
  /** The day's longest delay of the vehicle at the end of the queue, minutes (./queue-limit). */
  peakDelayMinutes: Float64Array;
  /** When the day's longest queue episode (by the day it began) cleared, h since startDate; NaN if none. */
  clearsAt: Float64Array;
  episodePeak: Float64Array;
}

export function newQueueDetail(days: number): QueueDetail {
  return { delay: new Float64Array(days), peakQueue: new Float64Array(days), peakDelayMinutes: new Float64Array(days), clearsAt: new Float64Array(days).fill(NaN), episodePeak: new Float64Array(days) };
}

const piece: QueuePiece = { queue: 0, delay: 0, clearsAfter: -1 };

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
    if (detail) record(detail, w, Math.floor(hour / 24), q0, t, mu);
    if (untilEmpty && piece.clearsAfter >= 0) return t + piece.clearsAfter;
    t = hb;
  }
  return t;
}

/** Only for the detail of a chosen iteration (the summary's representative, the CLI's breach count): never in the Monte Carlo loop. */
function record(detail: QueueDetail, w: Walk, day: number, q0: number, t: number, mu: number): void {
  const q = w.q;
  if (q0 <= 0 && q > 0) {
    w.episodeDay = day;
    w.episodePeak = 0;
  }
  detail.delay[day] += piece.delay;
  const peakHere = q > q0 ? q : q0;
  if (peakHere > detail.peakQueue[day]) detail.peakQueue[day] = peakHere;
  // The queue is served at mu through this piece, so the vehicle at its end waits queue / mu (D/D/1).
  const minutes = lastVehicleDelayMinutes(peakHere, mu);
  if (minutes > detail.peakDelayMinutes[day]) detail.peakDelayMinutes[day] = minutes;
  if (peakHere > w.episodePeak) w.episodePeak = peakHere;
  if (piece.clearsAfter >= 0 && w.episodeDay >= 0 && w.episodePeak >= detail.episodePeak[w.episodeDay]) {
    detail.episodePeak[w.episodeDay] = w.episodePeak;
    detail.clearsAt[w.episodeDay] = t + piece.clearsAfter;
  }
}

/** The `nextOver` table of a capacity, built the first time it is met; the direction remembers the last one. */
function overTable(dir: CompiledDirection, mu: number): Int32Array {
  return mu === dir.lastMu ? dir.lastOver! : overTableMiss(dir, mu);
}

function overTableMiss(dir: CompiledDirection, mu: number): Int32Array {
  let t = dir.nextOver.get(mu);
  if (!t) {
    t = nextHourOver(dir.hourDemand, mu);
    dir.nextOver.set(mu, t);
  }
  dir.lastMu = mu;
  dir.lastOver = t;
  return t;
}

/**
 * D/D/1 delay of one direction, veh-h, over the pieces of narrowed road of one iteration (from the closure
 * timeline, ./traffic-capacity). Outside them every lane is open (`openCapacity`) and only a standing queue is
 * walked: no closure means no work-zone delay. A queue still standing at the horizon is left there.
 */
export function queueDelay(m: TrafficModel, dir: CompiledDirection, pieces: CapacityPieces, detail: QueueDetail | null): number {
  const { starts, ends, caps, n } = pieces;
  if (n === 0) return 0;
  const horizon = 24 * m.days;
  // The model's scratch walk state (one `simulate` at a time per compiled scenario): no object per iteration.
  const w = m.walkState;
  w.q = 0;
  w.total = 0;
  w.episodeDay = -1;
  w.episodePeak = 0;
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
