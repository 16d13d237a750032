/**
 * The closure-hours advisor: the check a traffic engineer makes before approving closure hours. For each
 * closure (a short-term closure, alone or on top of the standing closure of a stage it works in, and each
 * stage's standing closure) and each demand day kind, from the hourly demand and the closure's capacity (the
 * capacity rules of ./traffic-capacity, MODEL.md "Traffic"), it says which hours keep the D/D/1 queue under a
 * limit (./queue-limit: miles of queue, or minutes of delay for the vehicle at its end). Contract:
 * - `longestClosureFrom[h]`: the most whole hours a closure set up at h:00 may stand with the queue under the
 *   limit (0–24); hour h is a good start when it is at least 1;
 * - `planned`: the queue of the scenario's own windows of that closure on that day kind (the whole window,
 *   set-up and take-down included: the lanes are closed then), hour by hour, with its peak and whether it
 *   breaks the limit. A standing closure stands round the clock: its "window" is the whole day.
 * Simplifications (stated so nobody mistakes them): a window that runs past midnight meets the next day's
 * profile of `NEXT_KIND`; a standing closure is walked over two days of the same kind from an empty road and
 * the second day is reported; the queue is walked after the closure ends (at the open-road rate) until it
 * clears, as the engine does. Pure; units veh/h, veh, miles, minutes.
 */
import { parseIsoDate } from "./dates";
import type { DayType, Scenario } from "./schema";
import { resolveStages } from "./stages";
import { compileTraffic, DEMAND_KINDS, queuePiece, type CompiledDirection, type DemandKind, type QueuePiece, type TrafficModel } from "./traffic";
import { capacityOf } from "./traffic-capacity";
import { breaksLimit, lastVehicleDelayMinutes, queueLimitOf, type QueueLimit } from "./queue-limit";


/** The demand kind of the day after (an overnight window runs into it). */
export const NEXT_KIND: Record<DemandKind, DemandKind> = { weekday: "weekday", friday: "saturday", saturday: "sunday", sunday: "weekday", holidayPeak: "holidayPeak" };

/**
 * Which calendar day types of a closure window can fall on a day of each demand kind. A holiday-peak day is
 * the holiday (day type `holiday`) or its weekend, or the getaway weekday before it — where a `weekday` window
 * meets holiday traffic — so both are checked against that demand.
 */
const WINDOW_DAY_TYPES: Record<DemandKind, DayType[]> = { weekday: ["weekday"], friday: ["weekday"], saturday: ["saturday"], sunday: ["sunday"], holidayPeak: ["holiday", "weekday"] };

export interface HourAdvice {
  hour: number;
  /** Demand of the binding direction, veh/h. */
  demand: number;
  /** Its capacity with the closure standing, veh/h. */
  capacity: number;
  /** Most whole hours a closure set up at this hour may stand (min over directions), 0–24. */
  longestClosureFrom: number;
  /** Queue of the planned windows at the end of this hour (binding direction), miles; 0 outside them. */
  plannedQueueMiles: number;
  /** Delay of the vehicle at the end of that queue (served at the closure's capacity), minutes. */
  plannedDelayMinutes: number;
}

export interface PlannedCheck {
  /** The windows checked, hours of the day (`end ≤ start` runs overnight). */
  windows: { start: number; end: number }[];
  peakQueueVeh: number;
  peakQueueMiles: number;
  /** Delay of the vehicle at the end of the longest queue, minutes. */
  peakDelayMinutes: number;
  /** Clock hour (0–23) in which the peak is reached. */
  peakHour: number;
  direction: string;
  breaks: boolean;
}

export interface ClosureAdvice {
  /** Timeline closure id: a short-term closure's id, or `stage:<id>`. */
  closure: string;
  /** With a short-term closure: the stage whose standing closure stands with it (null: none). */
  withStage: string | null;
  name: string;
  kind: "short" | "standing";
  lanes: string[];
  dayKind: DemandKind;
  hours: HourAdvice[];
  /** Null when the closure has no window on this day kind. */
  planned: PlannedCheck | null;
}

interface Peak {
  veh: number;
  minutes: number;
  hour: number;
}

/**
 * D/D/1 over the hours [from, from + length) of a demand strip (today's profile, then the next day's) at
 * capacity `cap`; then, with `discharge`, at the open-road rate until the queue clears (at most to the strip's
 * end). `queueAt[h]`, when given, receives the queue at the end of each clock hour h while the closure stands.
 * The queue is piecewise linear, so its largest value is at a piece end: checking them is exact.
 */
function walkClosure(strip: Float64Array, cap: number, openCap: number, from: number, length: number, o: { startQueue?: number; discharge?: boolean; queueAt?: Float64Array } = {}): Peak & { end: number } {
  const piece: QueuePiece = { queue: 0, delay: 0, clearsAfter: -1 };
  let q = o.startQueue ?? 0;
  const peak: Peak = { veh: q, minutes: lastVehicleDelayMinutes(q, cap), hour: Math.floor(from) % 24 };
  let t = from;
  const stop = from + length;
  while (t < strip.length && (t < stop || (o.discharge !== false && q > 0))) {
    const closed = t < stop;
    const mu = closed ? cap : openCap;
    const hb = Math.min(Math.floor(t) + 1, closed ? stop : Infinity, strip.length);
    queuePiece(q, strip[Math.floor(t)], mu, hb - t, piece);
    const q0 = q;
    q = piece.queue;
    if (q > peak.veh) {
      peak.veh = q;
      peak.hour = (Math.ceil(hb) - 1) % 24;
    }
    const minutes = lastVehicleDelayMinutes(q, mu);
    if (minutes > peak.minutes) peak.minutes = minutes;
    if (o.queueAt && closed && hb === Math.ceil(hb)) o.queueAt[(hb - 1) % 24] = Math.max(o.queueAt[(hb - 1) % 24], q);
    if (q0 <= 0 && q <= 0 && !closed) break;
    t = hb;
  }
  return { ...peak, end: q };
}

function strip(dir: CompiledDirection, kind: DemandKind): Float64Array {
  const k = DEMAND_KINDS.indexOf(kind);
  const n = DEMAND_KINDS.indexOf(NEXT_KIND[kind]);
  const out = new Float64Array(48);
  out.set(dir.demand.subarray(24 * k, 24 * k + 24), 0);
  out.set(dir.demand.subarray(24 * n, 24 * n + 24), 24);
  return out;
}

const miles = (m: TrafficModel, dir: CompiledDirection, veh: number) => (veh * dir.pcPerVeh) / (m.jamDensity * dir.storageLanes);

function breaks(m: TrafficModel, dir: CompiledDirection, p: Peak, limit: QueueLimit): boolean {
  return breaksLimit(limit, { miles: miles(m, dir, p.veh), minutes: p.minutes }) === true;
}

/** The set of timeline closures (bits) each advice entry stands for, with its labels. */
function closureSets(s: Scenario): { set: number; closure: string; withStage: string | null; name: string; kind: "short" | "standing"; lanes: string[] }[] {
  const stages = resolveStages(s);
  const nShort = s.calendar.closures.length;
  const out: ReturnType<typeof closureSets> = [];
  s.calendar.closures.forEach((c, j) => {
    const users = new Set(s.operations.filter((o) => o.kind === "crew" && o.closure === c.id).map((o) => s.operations.indexOf(o)));
    const contexts = stages.filter((st) => st.standing.length > 0 && st.ops.some((oi) => users.has(oi)));
    if (contexts.length === 0) out.push({ set: 1 << j, closure: c.id, withStage: null, name: c.name, kind: "short", lanes: c.lanesClosed });
    for (const st of contexts)
      out.push({ set: (1 << j) | (1 << (nShort + st.index)), closure: c.id, withStage: st.id, name: `${c.name} during ${st.name}`, kind: "short", lanes: [...new Set([...c.lanesClosed, ...st.standing])] });
  });
  stages.forEach((st) => {
    if (st.standing.length > 0) out.push({ set: 1 << (nShort + st.index), closure: `stage:${st.id}`, withStage: null, name: st.name, kind: "standing", lanes: st.standing });
  });
  return out;
}

/** Window hours of a closure on a day kind: `[start, start + length)`, hours of the day. */
function windowsOn(s: Scenario, closure: string, kind: DemandKind): { start: number; end: number; length: number }[] {
  const dayTypes = WINDOW_DAY_TYPES[kind];
  return s.calendar.closureWindows
    .filter((w) => w.closure === closure && w.dayTypes.some((t) => dayTypes.includes(t)))
    .map((w) => ({ start: w.startHour, end: w.endHour, length: w.endHour > w.startHour ? w.endHour - w.startHour : 24 - w.startHour + w.endHour }));
}

/** The advice for every closure × demand day kind, against the scenario's own queue limit unless another is given; [] without a traffic section. */
export function closureHoursAdvice(s: Scenario, limit: QueueLimit = queueLimitOf(s)): ClosureAdvice[] {
  const m = compileTraffic(s, parseIsoDate(s.startDate), 1);
  if (!m) return [];
  const out: ClosureAdvice[] = [];
  for (const entry of closureSets(s)) {
    const dirs = m.directions.map((dir) => ({ dir, cap: capacityOf(m, dir, entry.set) })).filter((d) => d.cap < Infinity);
    if (dirs.length === 0) continue;
    for (const kind of DEMAND_KINDS) {
      const strips = dirs.map((d) => strip(d.dir, kind));
      const longest = Array.from({ length: 24 }, (_, h) => {
        let best = 24;
        dirs.forEach((d, i) => {
          let L = 0;
          while (L < best && !breaks(m, d.dir, walkClosure(strips[i], d.cap, d.dir.openCapacity, h, L + 1), limit)) L++;
          best = Math.min(best, L);
        });
        return best;
      });
      const windows = entry.kind === "standing" ? [{ start: 0, end: 0, length: 24 }] : windowsOn(s, entry.closure, kind);
      let planned: PlannedCheck | null = null;
      let bindingQueue = new Float64Array(24);
      let binding = 0;
      if (windows.length > 0) {
        const perDir = dirs.map((d, i) => {
          const queueAt = new Float64Array(24);
          let peak: Peak = { veh: 0, minutes: 0, hour: Math.floor(windows[0].start) };
          for (const w of windows) {
            let p: Peak;
            if (entry.kind === "standing") {
              // Round the clock: day one from an empty road, then the same day again with what it carried over.
              const same = new Float64Array(48);
              same.set(strips[i].subarray(0, 24), 0);
              same.set(strips[i].subarray(0, 24), 24);
              const first = walkClosure(same, d.cap, d.dir.openCapacity, 0, 24, { discharge: false });
              p = walkClosure(same, d.cap, d.dir.openCapacity, 24, 24, { startQueue: first.end, discharge: false, queueAt });
            } else p = walkClosure(strips[i], d.cap, d.dir.openCapacity, w.start, w.length, { queueAt });
            if (p.veh > peak.veh) peak = { ...peak, veh: p.veh, hour: p.hour };
            if (p.minutes > peak.minutes) peak.minutes = p.minutes;
          }
          return { peak, queueAt, miles: miles(m, d.dir, peak.veh), breaks: breaks(m, d.dir, peak, limit) };
        });
        perDir.forEach((x, i) => {
          if (x.miles > perDir[binding].miles) binding = i;
        });
        const w = perDir[binding];
        bindingQueue = w.queueAt;
        planned = {
          windows: windows.map(({ start, end }) => ({ start, end })),
          peakQueueVeh: w.peak.veh,
          peakQueueMiles: w.miles,
          peakDelayMinutes: Math.max(...perDir.map((x) => x.peak.minutes)),
          peakHour: w.peak.hour,
          direction: dirs[binding].dir.id,
          breaks: perDir.some((x) => x.breaks),
        };
      }
      const bd = dirs[binding];
      out.push({
        closure: entry.closure,
        withStage: entry.withStage,
        name: entry.name,
        kind: entry.kind,
        lanes: entry.lanes,
        dayKind: kind,
        planned,
        hours: Array.from({ length: 24 }, (_, h) => ({
          hour: h,
          demand: strips[binding][h],
          capacity: bd.cap,
          longestClosureFrom: longest[h],
          plannedQueueMiles: miles(m, bd.dir, bindingQueue[h]),
          plannedDelayMinutes: lastVehicleDelayMinutes(bindingQueue[h], bd.cap),
        })),
      });
    }
  }
  return out;
}
