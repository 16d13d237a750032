/**
 * The event engine (MODEL.md is the contract). `compileScenario` does all per-scenario work once: packets,
 * the calendar (./calendar), precedence look-ups, gate profiles and scratch buffers. `simulate` runs one
 * iteration on its samples. Operations share no resource (a closure is a set of windows, not a lock), so
 * the precedence DAG is processed in topological order; inside an operation each crew is a process in an
 * event queue keyed by (free time, crew index): a freed crew claims the lowest unclaimed packet, waits
 * for ready, mobilizes, works (./gates) and
 * reports to the bookkeeping `WorkContext` below and frees itself at the packet's finish. Time jumps between
 * interval boundaries; hour slots are visited only where a weather gate must be checked.
 * The compiled object owns scratch buffers: one `simulate` at a time per compiled scenario.
 */
import {
  compileCalendar, firstIntervalAfter, seasonAt, stampShifts, unionLanesByDay, type CompiledCalendar, type OpCalendar,
} from "./calendar";
import { GateCache, gateProfileOf, pour, produce, profileKey, type GateProfile, type WorkSink } from "./gates";
import { EventQueue } from "./queue";
import type { IterationSamples } from "./samples";
import type { Scenario } from "./schema";
import type { WeatherSeries } from "./weather";

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

export function compileScenario(scenario: Scenario): CompiledScenario {
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
      return { index: i, id: op.id, kind: "wait", crews: 0, continuous: false, mobilizationHours: 0, closure: -1, profile: -1, risingFirst: false, noRainAfter: 0, gated: false, preds };
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
      gated: profile >= 0 || (op.continuous && ((op.gates.noRainHoursAfter ?? 0) > 0 || op.gates.rising === true)),
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
  return { scenario, calendar, packets, packetLen, ops, order: topoOrder(ops), closures, cutoffPacket, work };
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
      for (let i = 0; i < P; i++) {
        finish[base + i] = ready[i] + dur;
        if (trace) trace.packets.push({ op: op.id, packet: i, crew: -1, start: ready[i], finish: ready[i] + dur });
      }
    } else {
      const rate = samples.rateFtPerHour[oi];
      const extra = samples.discoveredExtraHours[oi];
      const opCal = cal.ops[oi]!;
      w.beginOp(op, opCal, trace ? trace.pauses : null);
      queue.clear();
      for (let k = 0; k < op.crews; k++) {
        queue.push(0, k, k);
        crewSeason[k] = 0;
        crewMobilized[k] = 0;
      }
      for (let i = 0; i < P; i++) {
        const free = queue.peekTime();
        const crew = queue.pop();
        const s = free > ready[i] ? free : ready[i];
        const t0 = w.firstOpen(s);
        let mob = 0;
        const season = t0 === Infinity ? 0 : seasonAt(cal, t0);
        if (!crewMobilized[crew]) mob = op.mobilizationHours;
        else if (season > crewSeason[crew]) mob = c.scenario.calendar.season.remobilizeHours;
        crewMobilized[crew] = 1;
        crewSeason[crew] = season;
        const m = mob > 0 ? w.mobilize(t0, mob, crew) : s;
        const ex = extra.length ? extra[i] : 0;
        discoveredHours += ex;
        const hours = c.packetLen[i] / rate + ex;
        const f = op.continuous ? w.pour(m, hours, i, crew) : w.produce(m, hours, i, crew);
        finish[base + i] = f;
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
    season1End: w.season1End,
    weatherLostShifts: w.weatherLost,
    discoveredHours,
    closureDayHours: closure.hours,
    closureDayRange: { first: closure.first, last: closure.last },
    weatherDaysUsed: w.gates.daysUsed,
    trace,
  };
}

/** Per-iteration bookkeeping and scratch: closure segments, weather-lost shift stamps, season-1 end. */
class WorkContext implements WorkSink {
  readonly finish: Float64Array;
  readonly prefMax: Float64Array;
  readonly ready: Float64Array;
  readonly queue = new EventQueue(16);
  readonly crewSeason = new Int32Array(16);
  readonly crewMobilized = new Uint8Array(16);
  lastStart = 0;
  weatherLost = 0;
  season1End = NaN;
  // Work and mobilization segments per lane (one lane per crew of an operation): chronological per lane,
  // so the union per closure is a k-way merge, not a sort.
  private segStarts: Float64Array[];
  private segEnds: Float64Array[];
  private readonly segCount: Int32Array;
  private readonly laneBase: Int32Array;
  private readonly closureLanes: Int32Array[];
  private readonly lanePos: Int32Array;
  private readonly closureOut: Float64Array;
  private readonly range = new Int32Array(2);
  private outFirst = 0;
  private outLast = -1;
  private gen = 0;
  private readonly prodStamp: Int32Array[];
  private readonly waitStamp: Int32Array[];
  private readonly waitList: Int32Array[];
  private waitCount = 0;
  private op!: CompiledOp;
  private opCal!: OpCalendar;
  private pauses: PauseRecord[] | null = null;
  private packet = 0;
  private crew = 0;

  constructor(
    private readonly cal: CompiledCalendar,
    readonly gates: GateCache,
    private readonly nClosures: number,
    packets: number,
    ops: CompiledOp[],
  ) {
    const nOps = ops.length;
    const shiftCounts = ops.map((o) => (o.kind === "crew" ? cal.ops[o.index]!.shifts.length : 0));
    this.finish = new Float64Array(nOps * packets);
    this.prefMax = new Float64Array(nOps * packets);
    this.ready = new Float64Array(packets);
    this.laneBase = new Int32Array(nOps);
    let lanes = 0;
    const byClosure: number[][] = Array.from({ length: nClosures }, () => []);
    for (const o of ops) {
      this.laneBase[o.index] = lanes;
      for (let k = 0; k < o.crews; k++) byClosure[o.closure].push(lanes + k);
      lanes += o.crews;
    }
    this.closureLanes = byClosure.map((l) => Int32Array.from(l));
    this.lanePos = new Int32Array(lanes);
    this.segStarts = Array.from({ length: lanes }, () => new Float64Array(64));
    this.segEnds = Array.from({ length: lanes }, () => new Float64Array(64));
    this.segCount = new Int32Array(lanes);
    this.closureOut = new Float64Array(nClosures * cal.days);
    this.prodStamp = shiftCounts.map((n) => new Int32Array(n));
    this.waitStamp = shiftCounts.map((n) => new Int32Array(n));
    this.waitList = shiftCounts.map((n) => new Int32Array(n));
  }

  begin(series: WeatherSeries): void {
    this.gates.reset(series);
    this.gen++;
    this.weatherLost = 0;
    this.season1End = NaN;
    this.segCount.fill(0);
  }

  beginOp(op: CompiledOp, opCal: OpCalendar, pauses: PauseRecord[] | null): void {
    this.op = op;
    this.opCal = opCal;
    this.pauses = pauses;
    this.waitCount = 0;
  }

  endOp(): void {
    const prod = this.prodStamp[this.op.index];
    const list = this.waitList[this.op.index];
    for (let j = 0; j < this.waitCount; j++) if (prod[list[j]] !== this.gen) this.weatherLost++;
  }

  /** First open instant (conditions 1–3) at or after `t`; Infinity past the horizon. */
  firstOpen(t: number): number {
    const iv = this.opCal.open;
    const i = firstIntervalAfter(iv, t);
    if (i >= iv.length) return Infinity;
    return iv.starts[i] > t ? iv.starts[i] : t;
  }

  /** Mobilization: `hours` of open time (1–3) from `t`, not weather-gated; counted as closure time. */
  mobilize(t: number, hours: number, crew: number): number {
    this.crew = crew;
    const iv = this.opCal.open;
    let rem = hours;
    for (let i = firstIntervalAfter(iv, t); i < iv.length; i++) {
      const a = iv.starts[i] > t ? iv.starts[i] : t;
      const avail = iv.ends[i] - a;
      if (avail >= rem - 1e-9) {
        this.segment(a, a + rem);
        return a + rem;
      }
      this.segment(a, iv.ends[i]);
      rem -= avail;
    }
    return Infinity;
  }

  produce(from: number, hours: number, packet: number, crew: number): number {
    this.packet = packet;
    this.crew = crew;
    const iv = this.opCal.open;
    return produce(iv, firstIntervalAfter(iv, from), this.gates, this.op.profile, from, hours, this);
  }

  pour(from: number, hours: number, packet: number, crew: number): number {
    this.packet = packet;
    this.crew = crew;
    const iv = this.opCal.open;
    const op = this.op;
    return pour(iv, firstIntervalAfter(iv, from), this.gates, op.profile, op.risingFirst, op.noRainAfter, from, hours, this);
  }

  production(a: number, b: number): void {
    if (!(b > a)) return;
    this.segment(a, b);
    // Only gated operations can wait on the weather, so only they need to know where they produced.
    if (this.op.gated) stampShifts(this.opCal.shifts, a, b, this.prodStamp[this.op.index], this.gen, null, 0);
    if (b <= this.cal.firstWinterStart && !(b <= this.season1End)) this.season1End = b;
  }

  weatherWait(a: number, b: number): void {
    if (!(b > a)) return;
    const oi = this.op.index;
    this.waitCount = stampShifts(this.opCal.shifts, a, b, this.waitStamp[oi], this.gen, this.waitList[oi], this.waitCount);
    if (this.pauses && this.lastStart < a) this.pause(a, b, "weather");
  }

  gap(a: number, b: number): void {
    if (this.pauses) this.pause(a, b, "closed");
  }

  private pause(start: number, end: number, reason: "weather" | "closed"): void {
    this.pauses!.push({ op: this.op.id, packet: this.packet, crew: this.crew, start, end, reason });
  }

  private segment(a: number, b: number): void {
    const lane = this.laneBase[this.op.index] + this.crew;
    const n = this.segCount[lane];
    if (n > 0 && this.segEnds[lane][n - 1] === a) {
      this.segEnds[lane][n - 1] = b;
      return;
    }
    if (n === this.segStarts[lane].length) {
      const s = new Float64Array(2 * n);
      const e = new Float64Array(2 * n);
      s.set(this.segStarts[lane]);
      e.set(this.segEnds[lane]);
      this.segStarts[lane] = s;
      this.segEnds[lane] = e;
    }
    this.segStarts[lane][n] = a;
    this.segEnds[lane][n] = b;
    this.segCount[lane] = n + 1;
  }

  /** Union of work and mobilization time per closure and day (closureOut[c · days + d]). */
  closureHours(): { hours: Float64Array; first: number; last: number } {
    const days = this.cal.days;
    const out = this.closureOut;
    if (this.outLast >= this.outFirst)
      for (let c = 0; c < this.nClosures; c++) out.fill(0, c * days + this.outFirst, c * days + this.outLast + 1);
    const range = this.range;
    range[0] = days;
    range[1] = -1;
    this.lanePos.fill(0);
    for (let c = 0; c < this.nClosures; c++)
      unionLanesByDay(this.segStarts, this.segEnds, this.segCount, this.closureLanes[c], this.lanePos, out, c * days, days, range);
    this.outFirst = range[0];
    this.outLast = range[1];
    return { hours: out, first: range[0], last: range[1] };
  }
}
