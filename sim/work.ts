/**
 * Per-iteration bookkeeping for the engine (./engine): finish and start times per stage operation and packet,
 * the crews' event queue, work and mobilization segments per crew, weather-lost shift stamps, season-1 end,
 * pauses for the trace. For the closure timeline (./timeline): per short-term closure, the first and last crew
 * instant in each window interval a crew under it used (`closureUse`); for the cost model (./cost): the days on
 * which some crew's shift held work or mobilization (`shiftDaysWorked`); both computed only when asked, after
 * the schedule. One instance per compiled scenario, reset by `simulate` for each iteration.
 */
import { doubledF64 } from "./typed-arrays";
import { firstIntervalAfter, nextIntervalAfter, stampShifts, type CompiledCalendar, type OpCalendar } from "./calendar";
import type { CompiledOp, PauseRecord } from "./engine";
import type { GateCache } from "./gates";
import { pour, produce, warmCureFinish, type WorkSink } from "./production";
import type { WeatherSeries } from "./weather";
import type { ActiveOverride } from "./weather-override-reads"; // forecast override
import { EventQueue } from "./queue";

/**
 * Per short-term closure, the window intervals crews under it used in the iteration: interval g (an index into
 * the closure's window intervals) was used when stamp[g] is `gen`, from first[g] to last[g]; lo … hi bound the
 * used indices (hi < lo: none). A closure's periods need nothing finer (./timeline).
 */
export interface ClosureUse {
  stamp: Int32Array;
  first: Float64Array;
  last: Float64Array;
  gen: number;
  lo: number;
  hi: number;
}

/** Per-iteration bookkeeping and scratch: crew segments, closure use, weather-lost shift stamps, season-1 end. */
export class WorkContext implements WorkSink {
  readonly finish: Float64Array;
  readonly prefMax: Float64Array;
  readonly ready: Float64Array;
  /** Per stage operation and packet: start of its mobilization or production (Infinity: none scheduled). */
  readonly packetStart: Float64Array;
  /** Per stage operation: its last packet's finish. */
  readonly stageOpFinish: Float64Array;
  readonly queue = new EventQueue(16);
  readonly crewSeason = new Int32Array(16);
  readonly crewMobilized = new Uint8Array(16);
  lastStart = 0;
  weatherLost = 0;
  season1End = NaN;
  // Work and mobilization segments per lane (one lane per crew of an operation), chronological per lane.
  private segStarts: Float64Array[];
  private segEnds: Float64Array[];
  private readonly segCount: Int32Array;
  private readonly laneBase: Int32Array;
  private readonly closureLanes: Int32Array[];
  private readonly use: ClosureUse[];
  /** Per crew lane: the scenario operation index (its calendar). */
  private readonly laneOp: Int32Array;
  private readonly dayStamp: Int32Array;
  // shiftDay[op][i]: the day shift i of the operation starts on, or -1 outside the horizon (fixed per scenario).
  private readonly shiftDay: Int32Array[];
  private dayGen = 0;
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
    const shiftCounts = ops.map((o) => (o.kind === "crew" ? cal.ops[o.op]!.shifts.length : 0));
    this.finish = new Float64Array(nOps * packets);
    this.prefMax = new Float64Array(nOps * packets);
    this.ready = new Float64Array(packets);
    this.packetStart = new Float64Array(nOps * packets);
    this.stageOpFinish = new Float64Array(nOps);
    this.laneBase = new Int32Array(nOps);
    let lanes = 0;
    const byClosure: number[][] = Array.from({ length: nClosures }, () => []);
    for (const o of ops) {
      this.laneBase[o.index] = lanes;
      if (o.closure >= 0) for (let k = 0; k < o.crews; k++) byClosure[o.closure].push(lanes + k);
      lanes += o.crews;
    }
    this.closureLanes = byClosure.map((l) => Int32Array.from(l));
    this.laneOp = new Int32Array(lanes);
    for (const o of ops) for (let k = 0; k < o.crews; k++) this.laneOp[this.laneBase[o.index] + k] = o.op;
    this.use = cal.closureWindows.map((win) => ({ stamp: new Int32Array(win.length), first: new Float64Array(win.length), last: new Float64Array(win.length), gen: 0, lo: 0, hi: -1 }));
    this.dayStamp = new Int32Array(cal.days + 2);
    this.shiftDay = cal.ops.map((oc) => {
      if (!oc) return new Int32Array(0);
      const sh = oc.shifts;
      const out = new Int32Array(sh.length);
      for (let i = 0; i < sh.length; i++) {
        const d = Math.floor(sh.starts[i] / 24);
        out[i] = d < 0 || d >= this.dayStamp.length ? -1 : d;
      }
      return out;
    });
    this.segStarts = Array.from({ length: lanes }, () => new Float64Array(64));
    this.segEnds = Array.from({ length: lanes }, () => new Float64Array(64));
    this.segCount = new Int32Array(lanes);
    this.prodStamp = shiftCounts.map((n) => new Int32Array(n));
    this.waitStamp = shiftCounts.map((n) => new Int32Array(n));
    this.waitList = shiftCounts.map((n) => new Int32Array(n));
  }

  begin(series: WeatherSeries, override: ActiveOverride | null = null): void {
    this.gates.reset(series, override); // forecast override
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
    return pour(iv, firstIntervalAfter(iv, from), this.gates, this.op, from, hours, this);
  }

  /** A wait of `hours` from `ready` counted only in slots at or above `aboveF` (MODEL.md, warm-hour cure). */
  warmCure(ready: number, hours: number, aboveF: number): number {
    return warmCureFinish(this.gates, aboveF, ready, hours, this.cal.horizonHours);
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
    this.pauses!.push({ op: this.op.id, stage: this.op.stageId, packet: this.packet, crew: this.crew, start, end, reason });
  }

  private segment(a: number, b: number): void {
    const lane = this.laneBase[this.op.index] + this.crew;
    const n = this.segCount[lane];
    if (n > 0 && this.segEnds[lane][n - 1] === a) {
      this.segEnds[lane][n - 1] = b;
      return;
    }
    if (n === this.segStarts[lane].length) this.growLane(lane); // out of line: see GateCache.need
    this.segStarts[lane][n] = a;
    this.segEnds[lane][n] = b;
    this.segCount[lane] = n + 1;
  }

  private growLane(lane: number): void {
    this.segStarts[lane] = doubledF64(this.segStarts[lane]);
    this.segEnds[lane] = doubledF64(this.segEnds[lane]);
  }

  /**
   * Per short-term closure, the window intervals its crews used this iteration (see `ClosureUse`), computed once
   * per iteration from the crews' segments. A segment lies in one window interval (open time is inside one),
   * and each lane's segments are chronological, so a lane's window index only moves forward. The buffers are
   * reused: valid until the next `simulate`.
   */
  closureUse(): ClosureUse[] {
    for (let c = 0; c < this.nClosures; c++) {
      const u = this.use[c];
      if (u.gen === this.gen) continue;
      u.gen = this.gen;
      u.lo = 0;
      u.hi = -1;
      const win = this.cal.closureWindows[c];
      const lanes = this.closureLanes[c];
      for (let j = 0; j < lanes.length; j++) {
        const l = lanes[j];
        const n = this.segCount[l];
        if (n === 0) continue;
        const st = this.segStarts[l];
        const en = this.segEnds[l];
        let g = firstIntervalAfter(win, st[0]);
        for (let k = 0; k < n; k++) {
          const a = st[k];
          g = nextIntervalAfter(win, g, a);
          if (u.stamp[g] !== this.gen) {
            u.stamp[g] = this.gen;
            u.first[g] = a;
            u.last[g] = en[k];
            if (u.hi < u.lo) u.lo = u.hi = g;
            else if (g < u.lo) u.lo = g;
            else if (g > u.hi) u.hi = g;
          } else {
            if (a < u.first[g]) u.first[g] = a;
            if (en[k] > u.last[g]) u.last[g] = en[k];
          }
        }
      }
    }
    return this.use;
  }

  /** Whether window interval g of closure c was used this iteration (after `closureUse`). */
  usedWindow(c: number, g: number): boolean {
    return this.use[c].stamp[g] === this.gen;
  }

  /**
   * Working days: distinct days on which a shift instance that starts that day holds some work or
   * mobilization of a crew (a night shift counts for the day it starts). Also the first and last such day.
   */
  shiftDaysWorked(): { days: number; first: number; last: number } {
    const stamp = this.dayStamp;
    const gen = ++this.dayGen; // its own counter: the method may be called more than once per iteration
    let days = 0;
    let first = Infinity;
    let last = -Infinity;
    for (let l = 0; l < this.segCount.length; l++) {
      const n = this.segCount[l];
      if (n === 0) continue;
      const shifts = this.cal.ops[this.laneOp[l]]!.shifts;
      const sDay = this.shiftDay[this.laneOp[l]];
      const ss = shifts.starts;
      const se = shifts.ends;
      const sl = shifts.length;
      const st = this.segStarts[l];
      const en = this.segEnds[l];
      // The lane's segments are chronological, so the first shift ending after a − 24 only moves forward (the
      // look-back of a day catches a shift begun the day before).
      let i0 = firstIntervalAfter(shifts, st[0] - 24);
      for (let j = 0; j < n; j++) {
        const a = st[j];
        const b = en[j];
        i0 = nextIntervalAfter(shifts, i0, a - 24);
        for (let i = i0; i < sl && ss[i] < b; i++) {
          if (se[i] <= a) continue;
          const d = sDay[i];
          if (d < 0 || stamp[d] === gen) continue;
          stamp[d] = gen;
          days++;
          if (d < first) first = d;
          if (d > last) last = d;
        }
      }
    }
    return { days, first, last };
  }
}
