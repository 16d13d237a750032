/**
 * The event engine (MODEL.md is the contract). `compileScenario` does all per-scenario work once: packets,
 * stages and their stage operations (./stages), the calendar (./calendar), precedence look-ups, gate profiles
 * and scratch buffers. `simulate` runs one iteration on its samples. Stage operations share no resource (a
 * closure is a set of windows, not a lock; the fleet rule is a link), so the precedence DAG is processed in
 * topological order; inside a stage operation each crew is a process in an event queue keyed by (free time,
 * crew index): a freed crew claims the lowest unclaimed packet of its stage, waits for ready, mobilizes, works
 * (./gates), reports to the bookkeeping `WorkContext` (./work) and frees itself at the packet's finish. Time
 * jumps between interval boundaries; hour slots are visited only where a weather gate must be checked. After
 * the schedule, the closure timeline (./timeline) is built from it.
 * The compiled object owns scratch buffers: one `simulate` at a time per compiled scenario.
 */
import { compileAsBuilt, withDiscovery, type AsBuiltState, type CompiledAsBuilt } from "./asbuilt";
import { compileCalendar, seasonAt, type CompiledCalendar } from "./calendar";
import { GateCache, gateProfileOf, profileKey, type GateProfile } from "./gates";
import { WorkContext } from "./work";
import type { IterationSamples } from "./samples";
import type { Scenario } from "./schema";
import { resolveStages, type ResolvedStage } from "./stages";
import { ClosureTimeline, type TimelineClosure } from "./timeline";
import type { WeatherOverride } from "./forecast-weather"; // forecast override

/** A link into a stage operation: `need[i]` = last packet of `from` (deck index) B's packet i waits for, −1 none. */
export interface CompiledPred {
  from: number;
  /** `from`'s packet range [lo, hi): B's same packet counts only inside it. */
  lo: number;
  hi: number;
  lagHours: number;
  need: Int32Array;
}

/** A stage operation: one operation of the scenario working the packets of one stage. */
export interface CompiledOp {
  /** Index among stage operations. */
  index: number;
  /** Index of the scenario operation (samples, calendar). */
  op: number;
  stage: number;
  id: string;
  stageId: string;
  /** The stage's packets [lo, hi). */
  lo: number;
  hi: number;
  kind: "crew" | "wait";
  crews: number;
  continuous: boolean;
  mobilizationHours: number;
  closure: number; // short-term closure index, -1 for none (and for wait operations)
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
  /** Packet links (the scenario's links inside the stage, and `restoredAhead` stage links). */
  preds: CompiledPred[];
  /** Links to the whole of another stage operation (fleet rule, `stageDone`): ready ≥ its finish + lagHours. */
  whole: { from: number; lagHours: number }[];
}

export interface CompiledScenario {
  scenario: Scenario;
  calendar: CompiledCalendar;
  packets: number;
  packetLen: Float64Array;
  stages: ResolvedStage[];
  /** Stage operations, stage by stage, each stage's operations in the scenario's order. */
  ops: CompiledOp[];
  order: number[];
  /** Short-term closure ids (calendar.closures order). */
  closures: string[];
  /** Closures of the timeline: the short-term closures, then one standing closure per stage. */
  timelineClosures: TimelineClosure[];
  /** First packet index at or past the cut-off station (packets = no cut-off). */
  cutoffPacket: number;
  work: WorkContext;
  timeline: ClosureTimeline;
  /** A re-forecast's as-built state (MODEL.md, "Re-forecast"); null for a plan. */
  asBuilt: CompiledAsBuilt | null;
  /** forecast override: the forecast hours every iteration reads instead of the climate's (MODEL.md); null for none. */
  weatherOverride: WeatherOverride | null;
}

export interface CompileOptions {
  /** Start from this as-built state: done packets keep their recorded finish, time starts at the data date. */
  asBuilt?: AsBuiltState;
  /** forecast override: the days from the weather forecast (sim/forecast-weather.ts `weatherOverride`). */
  weatherOverride?: WeatherOverride | null;
}

export interface TracePacket {
  op: string;
  /** The stage id (always set by the engine; absent in traces stored before stages existed). */
  stage?: string;
  packet: number;
  crew: number; // -1 for wait operations
  start: number;
  finish: number;
  mobilizedFrom?: number;
}

export interface PauseRecord {
  op: string;
  stage?: string;
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
  /** Per scenario operation: its last packet over every stage. */
  opFinish: Float64Array;
  /** Per stage: its restoration (last stage-operation packet). */
  stageFinish: Float64Array;
  season1End: number; // NaN when nothing was produced before the first winter
  weatherLostShifts: number;
  discoveredHours: number;
  /** Lane-closed hours of the closure timeline (MODEL.md, "Closures that stand"). */
  laneClosedHours: number;
  /** Per timeline closure (short-term, then standing per stage): Σ |lanes| · duration of its periods. */
  laneClosedByClosure: Float64Array;
  /** A standing closure stood through (part of) a winter. */
  winterStanding: boolean;
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
  const closures = scenario.calendar.closures.map((c) => c.id);
  const profiles: GateProfile[] = [];
  const profileIds = new Map<string, number>();
  const stages = resolveStages(scenario);

  // Stage operations, and where each (stage, operation) landed.
  const ops: CompiledOp[] = [];
  const at = stages.map(() => new Map<number, number>());
  for (const st of stages) {
    for (const oi of st.ops) {
      const op = scenario.operations[oi];
      at[st.index].set(oi, ops.length);
      const common = { index: ops.length, op: oi, stage: st.index, id: op.id, stageId: st.id, lo: st.lo, hi: st.hi, preds: [] as CompiledPred[], whole: [] as CompiledOp["whole"] };
      if (op.kind === "wait") {
        ops.push({
          ...common, kind: "wait", crews: 0, continuous: false, mobilizationHours: 0, closure: -1, profile: -1,
          risingFirst: false, noRainAfter: 0, protectMinF: -Infinity, protectHours: 0, countAboveF: op.countAboveF ?? NaN, gated: false,
        });
        continue;
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
      ops.push({
        ...common,
        kind: "crew",
        crews: op.crews,
        continuous: op.continuous,
        mobilizationHours: op.mobilizationHours,
        closure: op.closure === undefined ? -1 : closures.indexOf(op.closure),
        profile,
        risingFirst: op.continuous && op.gates.rising === true,
        noRainAfter: op.continuous ? (op.gates.noRainHoursAfter ?? 0) : 0,
        protectMinF: protect ? pa!.minTempF! : -Infinity,
        protectHours: protect ? pa!.hours! : 0,
        countAboveF: NaN,
        gated: profile >= 0 || protect || (op.continuous && ((op.gates.noRainHoursAfter ?? 0) > 0 || op.gates.rising === true)),
      });
    }
  }
  const index = new Map(scenario.operations.map((o, i) => [o.id, i]));
  /** B's packet i waits for A's packets with start < e_i + lagFt, within A's range. */
  const need = (a: CompiledOp, lagFt: number): Int32Array => {
    const out = new Int32Array(packets).fill(-1);
    let k = a.lo - 1;
    for (let i = 0; i < packets; i++) {
      const reach = Math.min((i + 1) * packetFt, lengthFt) + lagFt;
      while (k + 1 < a.hi && (k + 1) * packetFt < reach) k++;
      out[i] = k;
    }
    return out;
  };
  for (const st of stages) {
    const mine = at[st.index];
    // The scenario's links inside the stage.
    for (const l of scenario.links) {
      const a = mine.get(index.get(l.from)!);
      const b = mine.get(index.get(l.to)!);
      if (a === undefined || b === undefined) continue;
      ops[b].preds.push({ from: a, lo: ops[a].lo, hi: ops[a].hi, lagHours: l.lagHours, need: need(ops[a], l.lagFt) });
    }
    // Fleet rule: the same operation's previous stage operation, whole.
    for (const [oi, b] of mine) {
      for (let e = st.index - 1; e >= 0; e--) {
        const a = at[e].get(oi);
        if (a !== undefined) {
          ops[b].whole.push({ from: a, lagHours: 0 });
          break;
        }
      }
    }
    // Stage order.
    if (!st.after) continue;
    const earlier = stages[st.after.stage];
    const inStage = (s: ResolvedStage, dir: "from" | "to") => new Set(scenario.links.filter((l) => s.ops.includes(index.get(l.from)!) && s.ops.includes(index.get(l.to)!)).map((l) => index.get(l[dir])!));
    const hasPred = inStage(st, "to");
    const sources = st.ops.filter((oi) => !hasPred.has(oi)).map((oi) => mine.get(oi)!);
    if (st.after.when === "stageDone") {
      for (const b of sources) for (const a of at[earlier.index].values()) ops[b].whole.push({ from: a, lagHours: st.after.lagHours });
    } else {
      const hasSucc = inStage(earlier, "from");
      const sinks = earlier.ops.filter((oi) => !hasSucc.has(oi)).map((oi) => at[earlier.index].get(oi)!);
      for (const b of sources) for (const a of sinks) ops[b].preds.push({ from: a, lo: ops[a].lo, hi: ops[a].hi, lagHours: st.after.lagHours, need: need(ops[a], st.after.lagFt) });
    }
  }

  const season = scenario.calendar.season;
  let cutoffPacket = packets;
  if (season.plan === "two" && season.cutoffStationFt !== undefined) {
    const off = season.cutoffStationFt - scenario.deck.startStationFt;
    cutoffPacket = 0;
    while (cutoffPacket < packets && cutoffPacket * packetFt < off) cutoffPacket++;
  }
  const gates = new GateCache(profiles, calendar.days);
  const work = new WorkContext(calendar, gates, closures.length, packets, ops);
  const timelineClosures: TimelineClosure[] = [
    ...scenario.calendar.closures.map((c): TimelineClosure => ({ id: c.id, name: c.name, kind: "short", lanes: c.lanesClosed, setupHours: c.setupHours, takedownHours: c.takedownHours })),
    ...stages.map((st): TimelineClosure => ({ id: `stage:${st.id}`, name: st.name, kind: "standing", lanes: st.standing, setupHours: 0, takedownHours: 0 })),
  ];
  const timeline = new ClosureTimeline(scenario, calendar, stages, ops, timelineClosures, packets);
  const asBuilt = options.asBuilt ? compileAsBuilt(scenario, options.asBuilt, calendar, packets, ops) : null;
  const weatherOverride = options.weatherOverride ?? null; // forecast override
  return { scenario, calendar, packets, packetLen, stages, ops, order: topoOrder(ops), closures, timelineClosures, cutoffPacket, work, timeline, asBuilt, weatherOverride };
}

function topoOrder(ops: CompiledOp[]): number[] {
  const done = new Uint8Array(ops.length);
  const order: number[] = [];
  while (order.length < ops.length) {
    const before = order.length;
    for (const op of ops) {
      if (!done[op.index] && op.preds.every((p) => done[p.from]) && op.whole.every((p) => done[p.from])) {
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
  w.begin(samples.weather, samples.weatherOverride ?? null); // forecast override
  const finish = w.finish;
  const prefMax = w.prefMax;
  const ready = w.ready;
  const started = w.packetStart;
  const soFinish = w.stageOpFinish;
  const opFinish = new Float64Array(c.scenario.operations.length).fill(-Infinity);
  const stageFinish = new Float64Array(c.stages.length).fill(-Infinity);
  const queue = w.queue;
  const crewSeason = w.crewSeason;
  const crewMobilized = w.crewMobilized;
  const trace: Trace | undefined = opts.trace ? { packets: [], pauses: [] } : undefined;
  const ab = c.asBuilt;
  let discoveredHours = 0;

  for (const si of c.order) {
    const op = c.ops[si];
    const oi = op.op;
    const base = si * P;
    const lo = op.lo;
    const hi = op.hi;
    let wholeReady = 0;
    for (const pr of op.whole) {
      const f = soFinish[pr.from] + pr.lagHours;
      if (f > wholeReady) wholeReady = f;
    }
    for (let i = lo; i < hi; i++) {
      let r = wholeReady;
      for (const pr of op.preds) {
        const fb = pr.from * P;
        if (i >= pr.lo && i < pr.hi) {
          const a = finish[fb + i] + pr.lagHours;
          if (a > r) r = a;
        }
        const k = pr.need[i];
        if (k >= 0) {
          const b = prefMax[fb + k];
          if (b > r) r = b;
        }
      }
      if (op.kind === "crew" && i >= c.cutoffPacket && cal.firstWinterEnd > r) r = cal.firstWinterEnd;
      ready[i] = r;
    }
    if (op.kind === "wait") {
      const dur = samples.waitHours[oi];
      const above = op.countAboveF;
      for (let i = lo; i < hi; i++) {
        const f = above === above ? w.warmCure(ready[i], dur, above) : ready[i] + dur;
        finish[base + i] = f;
        started[base + i] = Infinity;
        if (trace) trace.packets.push({ op: op.id, stage: op.stageId, packet: i, crew: -1, start: ready[i], finish: f });
      }
    } else {
      const rate = samples.rateFtPerHour[oi];
      const extra = samples.discoveredExtraHours[oi];
      const opCal = cal.ops[oi]!;
      w.beginOp(op, opCal, trace ? trace.pauses : null);
      queue.clear();
      // A re-forecast's crews are free from the data date; those of a started stage operation are mobilized.
      const free0 = ab ? ab.crewFree[si] : 0;
      for (let k = 0; k < op.crews; k++) {
        queue.push(free0, k, k);
        crewSeason[k] = ab ? ab.crewSeason[si] : 0;
        crewMobilized[k] = ab ? ab.started[si] : 0;
      }
      for (let i = lo; i < hi; i++) {
        if (ab) {
          const done = ab.doneFinish[base + i];
          if (done === done) {
            finish[base + i] = done; // as built: never claimed, never scheduled again
            started[base + i] = -Infinity;
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
        started[base + i] = mob > 0 ? t0 : w.lastStart;
        // "After a winter" counts from this packet's production start (MODEL.md, "Work"): a packet that waited
        // through a winter and started after it leaves the crew in the new season, not the one it was claimed in.
        crewSeason[crew] = w.lastStart < Infinity ? seasonAt(cal, w.lastStart) : season;
        queue.push(f, crew, crew);
        if (trace) {
          const tp: TracePacket = { op: op.id, stage: op.stageId, packet: i, crew, start: w.lastStart, finish: f };
          if (mob > 0) tp.mobilizedFrom = t0;
          trace.packets.push(tp);
        }
      }
      w.endOp();
    }
    let mx = -Infinity;
    for (let i = lo; i < hi; i++) {
      const f = finish[base + i];
      if (f > mx) mx = f;
      prefMax[base + i] = mx;
    }
    soFinish[si] = mx;
    if (mx > opFinish[oi]) opFinish[oi] = mx;
    if (mx > stageFinish[op.stage]) stageFinish[op.stage] = mx;
  }

  let overall = -Infinity;
  for (let i = 0; i < stageFinish.length; i++) if (stageFinish[i] > overall) overall = stageFinish[i];
  const unfinished = !(overall < Infinity);
  const tl = c.timeline.build(w, stageFinish, ab);
  return {
    finish: unfinished ? Infinity : overall,
    unfinished,
    opFinish,
    stageFinish,
    season1End: ab && ab.season1End === ab.season1End && !(ab.season1End <= w.season1End) ? ab.season1End : w.season1End,
    weatherLostShifts: w.weatherLost,
    discoveredHours,
    laneClosedHours: tl.total,
    laneClosedByClosure: tl.byClosure,
    winterStanding: tl.winterStanding,
    weatherDaysUsed: w.gates.daysUsed,
    trace,
  };
}
