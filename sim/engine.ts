/**
 * The event engine (MODEL.md is the contract). `compileScenario` does all per-scenario work once: packets,
 * the calendar (./calendar), precedence look-ups, gate profiles and scratch buffers. `simulate` runs one
 * iteration on its samples. Operations share no resource (a closure is a set of windows, not a lock), so
 * the precedence DAG is processed in topological order; inside an operation each crew is a process in an
 * event queue keyed by (free time, crew index): a freed crew claims the lowest unclaimed packet, waits
 * for ready, mobilizes, works (./gates) and
 * reports to the bookkeeping `WorkContext` (./work) and frees itself at the packet's finish. Time jumps between
 * interval boundaries; hour slots are visited only where a weather gate must be checked.
 * The compiled object owns scratch buffers: one `simulate` at a time per compiled scenario.
 */
import { compileAsBuilt, withDiscovery, type AsBuiltState, type CompiledAsBuilt } from "./asbuilt";
import { compileCalendar, seasonAt, type CompiledCalendar } from "./calendar";
import { GateCache, gateProfileOf, profileKey, type GateProfile } from "./gates";
import { WorkContext } from "./work";
import type { IterationSamples } from "./samples";
import type { Scenario } from "./schema";

export interface CompiledOp {
  index: number;
  id: string;
  kind: "crew" | "wait";
  crews: number;
  continuous: boolean;
  mobilizationHours: number;
  closure: number; // -1 for wait operations
  profile: number; // gate profile index, -1 when no per-slot gate
  risingFirst: boolean;
  noRainAfter: number;
  /** Protection window after a continuous packet: air ≥ protectMinF for protectHours (0 = none). */
  protectMinF: number;
  protectHours: number;
  /** Wait operations: count only hours at or above this temperature (NaN = every hour counts). */
  countAboveF: number;
  /** Any weather gate at all (per-slot, rising or no-rain-after). */
  gated: boolean;
  preds: { from: number; lagHours: number; need: Int32Array }[];
}

export interface CompiledScenario {
  scenario: Scenario;
  calendar: CompiledCalendar;
  packets: number;
  packetLen: Float64Array;
  ops: CompiledOp[];
  order: number[];
  closures: string[];
  /** First packet index at or past the cut-off station (packets = no cut-off). */
  cutoffPacket: number;
  work: WorkContext;
  /** A re-forecast's as-built state (MODEL.md, "Re-forecast"); null for a plan. */
  asBuilt: CompiledAsBuilt | null;
}

export interface CompileOptions {
  /** Start from this as-built state: done packets keep their recorded finish, time starts at the data date. */
  asBuilt?: AsBuiltState;
}

export interface TracePacket {
  op: string;
  packet: number;
  crew: number; // -1 for wait operations
  start: number;
  finish: number;
  mobilizedFrom?: number;
}

export interface PauseRecord {
  op: string;
  packet: number;
  crew: number;
  start: number;
  end: number;
  reason: "weather" | "closed";
}

export interface Trace {
  packets: TracePacket[];
  pauses: PauseRecord[];
}

export interface SimResult {
  finish: number; // hours since 00:00 of startDate; Infinity when unfinished
  unfinished: boolean;
  opFinish: Float64Array;
  season1End: number; // NaN when nothing was produced before the first winter
  weatherLostShifts: number;
  discoveredHours: number;
  /** Closure hours per closure and day: closureDayHours[c · days + d]; valid until the next simulate. */
  closureDayHours: Float64Array;
  closureDayRange: { first: number; last: number };
  weatherDaysUsed: number;
  trace?: Trace;
}

export function compileScenario(plan: Scenario, options: CompileOptions = {}): CompiledScenario {
  // The discovery update lives in the scenario the samples are drawn from; with nothing inspected it is `plan`.
  const scenario = options.asBuilt ? withDiscovery(plan, options.asBuilt) : plan;
  const calendar = compileCalendar(scenario);
  const { lengthFt, packetFt } = scenario.deck;
  const packets = Math.ceil(lengthFt / packetFt);
  const packetLen = new Float64Array(packets);
  for (let i = 0; i < packets; i++) packetLen[i] = Math.min((i + 1) * packetFt, lengthFt) - i * packetFt;
  const index = new Map(scenario.operations.map((o, i) => [o.id, i]));
  const closures = scenario.calendar.closures.map((c) => c.id);
  const profiles: GateProfile[] = [];
  const profileIds = new Map<string, number>();

  const ops: CompiledOp[] = scenario.operations.map((op, i) => {
    const preds = scenario.links
      .filter((l) => l.to === op.id)
      .map((l) => {
        const need = new Int32Array(packets);
        for (let p = 0; p < packets; p++) {
          const reach = Math.min((p + 1) * packetFt, lengthFt) + l.lagFt;
          let k = p;
          while (k + 1 < packets && (k + 1) * packetFt < reach) k++;
          need[p] = k;
        }
        return { from: index.get(l.from)!, lagHours: l.lagHours, need };
      });
    if (op.kind === "wait") {
      return {
        index: i, id: op.id, kind: "wait", crews: 0, continuous: false, mobilizationHours: 0, closure: -1, profile: -1,
        risingFirst: false, noRainAfter: 0, protectMinF: -Infinity, protectHours: 0, countAboveF: op.countAboveF ?? NaN, gated: false, preds,
      };
    }
    const prof = gateProfileOf(op);
    let profile = -1;
    if (prof) {
      const key = profileKey(prof);
      if (!profileIds.has(key)) {
        profileIds.set(key, profiles.length);
        profiles.push(prof);
      }
      profile = profileIds.get(key)!;
    }
    const pa = op.gates.protectAfter;
    const protect = op.continuous && pa?.minTempF !== undefined && pa.hours !== undefined && pa.hours > 0;
    return {
      index: i,
      id: op.id,
      kind: "crew",
      crews: op.crews,
      continuous: op.continuous,
      mobilizationHours: op.mobilizationHours,
      closure: closures.indexOf(op.closure),
      profile,
      risingFirst: op.continuous && op.gates.rising === true,
      noRainAfter: op.continuous ? (op.gates.noRainHoursAfter ?? 0) : 0,
      protectMinF: protect ? pa!.minTempF! : -Infinity,
      protectHours: protect ? pa!.hours! : 0,
      countAboveF: NaN,
      gated: profile >= 0 || protect || (op.continuous && ((op.gates.noRainHoursAfter ?? 0) > 0 || op.gates.rising === true)),
      preds,
    };
  });

  const season = scenario.calendar.season;
  let cutoffPacket = packets;
  if (season.plan === "two" && season.cutoffStationFt !== undefined) {
    const off = season.cutoffStationFt - scenario.deck.startStationFt;
    cutoffPacket = 0;
    while (cutoffPacket < packets && cutoffPacket * packetFt < off) cutoffPacket++;
  }
  const gates = new GateCache(profiles, calendar.days);
  const work = new WorkContext(calendar, gates, closures.length, packets, ops);
  const asBuilt = options.asBuilt ? compileAsBuilt(scenario, options.asBuilt, calendar, packets) : null;
  return { scenario, calendar, packets, packetLen, ops, order: topoOrder(ops), closures, cutoffPacket, work, asBuilt };
}

function topoOrder(ops: CompiledOp[]): number[] {
  const done = new Uint8Array(ops.length);
  const order: number[] = [];
  while (order.length < ops.length) {
    const before = order.length;
    for (const op of ops) {
      if (!done[op.index] && op.preds.every((p) => done[p.from])) {
        done[op.index] = 1;
        order.push(op.index);
      }
    }
    if (order.length === before) throw new Error("links form a cycle (validate the scenario first)");
  }
  return order;
}

export function simulate(c: CompiledScenario, samples: IterationSamples, opts: { trace?: boolean } = {}): SimResult {
  const P = c.packets;
  const w = c.work;
  const cal = c.calendar;
  w.begin(samples.weather);
  const finish = w.finish;
  const prefMax = w.prefMax;
  const ready = w.ready;
  const opFinish = new Float64Array(c.ops.length);
  const queue = w.queue;
  const crewSeason = w.crewSeason;
  const crewMobilized = w.crewMobilized;
  const trace: Trace | undefined = opts.trace ? { packets: [], pauses: [] } : undefined;
  const ab = c.asBuilt;
  let discoveredHours = 0;

  for (const oi of c.order) {
    const op = c.ops[oi];
    const base = oi * P;
    for (let i = 0; i < P; i++) {
      let r = 0;
      for (const pr of op.preds) {
        const fb = pr.from * P;
        const a = finish[fb + i] + pr.lagHours;
        const b = prefMax[fb + pr.need[i]];
        if (a > r) r = a;
        if (b > r) r = b;
      }
      if (op.kind === "crew" && i >= c.cutoffPacket && cal.firstWinterEnd > r) r = cal.firstWinterEnd;
      ready[i] = r;
    }
    if (op.kind === "wait") {
      const dur = samples.waitHours[oi];
      const above = op.countAboveF;
      for (let i = 0; i < P; i++) {
        const f = above === above ? w.warmCure(ready[i], dur, above) : ready[i] + dur;
        finish[base + i] = f;
        if (trace) trace.packets.push({ op: op.id, packet: i, crew: -1, start: ready[i], finish: f });
      }
    } else {
      const rate = samples.rateFtPerHour[oi];
      const extra = samples.discoveredExtraHours[oi];
      const opCal = cal.ops[oi]!;
      w.beginOp(op, opCal, trace ? trace.pauses : null);
      queue.clear();
      // A re-forecast's crews are free from the data date; those of a started operation are mobilized.
      const free0 = ab ? ab.crewFree[oi] : 0;
      for (let k = 0; k < op.crews; k++) {
        queue.push(free0, k, k);
        crewSeason[k] = ab ? ab.crewSeason[oi] : 0;
        crewMobilized[k] = ab ? ab.started[oi] : 0;
      }
      for (let i = 0; i < P; i++) {
        if (ab) {
          const done = ab.doneFinish[base + i];
          if (done === done) {
            finish[base + i] = done; // as built: never claimed, never scheduled again
            continue;
          }
        }
        const free = queue.peekTime();
        const crew = queue.pop();
        const s = free > ready[i] ? free : ready[i];
        const t0 = w.firstOpen(s);
        let mob = 0;
        const season = t0 === Infinity ? 0 : seasonAt(cal, t0);
        if (!crewMobilized[crew]) mob = op.mobilizationHours;
        else if (season > crewSeason[crew]) mob = c.scenario.calendar.season.remobilizeHours;
        crewMobilized[crew] = 1;
        const m = mob > 0 ? w.mobilize(t0, mob, crew) : s;
        const ex = extra.length ? extra[i] : 0;
        discoveredHours += ex;
        const len = ab ? c.packetLen[i] * ab.remaining[base + i] : c.packetLen[i];
        const hours = len / rate + ex;
        const f = op.continuous ? w.pour(m, hours, i, crew) : w.produce(m, hours, i, crew);
        finish[base + i] = f;
        // "After a winter" counts from this packet's production start (MODEL.md, "Work"): a packet that waited
        // through a winter and started after it leaves the crew in the new season, not the one it was claimed in.
        crewSeason[crew] = w.lastStart < Infinity ? seasonAt(cal, w.lastStart) : season;
        queue.push(f, crew, crew);
        if (trace) {
          const tp: TracePacket = { op: op.id, packet: i, crew, start: w.lastStart, finish: f };
          if (mob > 0) tp.mobilizedFrom = t0;
          trace.packets.push(tp);
        }
      }
      w.endOp();
    }
    let mx = -Infinity;
    let of = -Infinity;
    for (let i = 0; i < P; i++) {
      const f = finish[base + i];
      if (f > mx) mx = f;
      prefMax[base + i] = mx;
      if (f > of) of = f;
    }
    opFinish[oi] = of;
  }

  let overall = -Infinity;
  for (let i = 0; i < opFinish.length; i++) if (opFinish[i] > overall) overall = opFinish[i];
  const unfinished = !(overall < Infinity);
  const closure = w.closureHours();
  return {
    finish: unfinished ? Infinity : overall,
    unfinished,
    opFinish,
    season1End: ab && ab.season1End === ab.season1End && !(ab.season1End <= w.season1End) ? ab.season1End : w.season1End,
    weatherLostShifts: w.weatherLost,
    discoveredHours,
    closureDayHours: closure.hours,
    closureDayRange: { first: closure.first, last: closure.last },
    weatherDaysUsed: w.gates.daysUsed,
    trace,
  };
}
