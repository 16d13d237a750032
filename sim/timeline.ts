/**
 * The closure timeline of one iteration (MODEL.md, "Closures that stand"). Contract: `build` turns the
 * schedule just simulated into periods per timeline closure — the short-term closures (calendar order), then
 * one standing closure per stage — chronological and disjoint within each closure:
 * - a short-term closure stands once per window interval that some crew under it used, from its first use
 *   − set-up to its last use + take-down;
 * - a stage's standing closure stands from the first mobilization or production start of any of its crew
 *   stage operations to the stage's restoration, except that a two-season plan lifts it over the first winter
 *   when every packet started by then is restored (set up again at the first start after that winter).
 * It returns lane-closed hours (total = ∫ |lanes closed|, by closure = Σ |lanes| · duration) and whether a
 * standing closure stood in a winter. `pieces(select)` sweeps the periods of the selected closures into
 * elementary pieces with the set of closures standing in each (for the traffic model and the by-day figures).
 * Buffers are reused: valid until the next `simulate` of the same compiled scenario.
 */
import { doubledF64, doubledI32 } from "./typed-arrays";
import { addHoursByDay, type CompiledCalendar } from "./calendar";
import type { CompiledAsBuilt } from "./asbuilt";
import type { CompiledOp } from "./engine";
import type { Scenario } from "./schema";
import type { ResolvedStage } from "./stages";
import type { WorkContext } from "./work";

export interface TimelineClosure {
  id: string;
  name: string;
  kind: "short" | "standing";
  lanes: string[];
  setupHours: number;
  takedownHours: number;
}

/** Periods per closure: starts[j][0 … counts[j]), chronological and disjoint. */
export interface ClosurePeriods {
  starts: Float64Array[];
  ends: Float64Array[];
  counts: Int32Array;
}

/** Elementary pieces of a sweep: [starts[k], ends[k]) with the bit set of the closures standing (bit j = closure j). */
export interface Pieces {
  starts: Float64Array;
  ends: Float64Array;
  sets: Int32Array;
  n: number;
}

export function popcount(x: number): number {
  let n = 0;
  while (x) {
    x &= x - 1;
    n++;
  }
  return n;
}

export class ClosureTimeline {
  readonly periods: ClosurePeriods;
  /** Per timeline closure: its lanes as a bit mask over deck.lanes. */
  readonly masks: Int32Array;
  readonly byClosure: Float64Array;
  private readonly nShort: number;
  private readonly pos: Int32Array;
  private readonly piecesOut: Pieces = { starts: new Float64Array(256), ends: new Float64Array(256), sets: new Int32Array(256), n: 0 };
  private readonly stageOps: CompiledOp[][];
  private readonly twoSeason: boolean;
  /** The closures (bit set) the last sweep covered, −1 when `piecesOut` holds none of this timeline's. */
  private swept = -1;

  constructor(
    scenario: Scenario,
    private readonly cal: CompiledCalendar,
    private readonly stages: ResolvedStage[],
    ops: CompiledOp[],
    readonly closures: TimelineClosure[],
    private readonly packets: number,
  ) {
    const laneBit = new Map(scenario.deck.lanes.map((l, i) => [l, 1 << i]));
    this.masks = Int32Array.from(closures, (c) => c.lanes.reduce((m, l) => m | (laneBit.get(l) ?? 0), 0));
    this.nShort = scenario.calendar.closures.length;
    const n = closures.length;
    this.periods = { starts: closures.map(() => new Float64Array(16)), ends: closures.map(() => new Float64Array(16)), counts: new Int32Array(n) };
    this.byClosure = new Float64Array(n);
    this.pos = new Int32Array(n);
    this.stageOps = stages.map((st) => ops.filter((o) => o.stage === st.index));
    this.twoSeason = scenario.calendar.season.plan === "two";
  }

  private push(j: number, a: number, b: number): void {
    const p = this.periods;
    const n = p.counts[j];
    if (n === p.starts[j].length) this.growPeriods(j); // out of line: see GateCache.need
    p.starts[j][n] = a;
    p.ends[j][n] = b;
    p.counts[j] = n + 1;
  }

  private growPeriods(j: number): void {
    const p = this.periods;
    p.starts[j] = doubledF64(p.starts[j]);
    p.ends[j] = doubledF64(p.ends[j]);
  }

  build(w: WorkContext, stageFinish: Float64Array, ab: CompiledAsBuilt | null): { total: number; byClosure: Float64Array; winterStanding: boolean } {
    const p = this.periods;
    p.counts.fill(0);
    this.swept = -1;
    const horizon = this.cal.horizonHours;
    // Short-term closures: one period per window interval a crew under the closure used.
    const use = w.closureUse();
    for (let c = 0; c < this.nShort; c++) {
      const cl = this.closures[c];
      const u = use[c];
      for (let g = u.lo; g <= u.hi; g++) if (w.usedWindow(c, g)) this.push(c, u.first[g] - cl.setupHours, u.last[g] + cl.takedownHours);
    }
    // Standing closures, one per stage with lanes behind barrier.
    let winterStanding = false;
    const P = this.packets;
    const fin = w.finish;
    const ps = w.packetStart;
    const W = this.cal.firstWinterStart;
    for (const stage of this.stages) {
      const j = this.nShort + stage.index;
      if (this.masks[j] === 0) continue;
      const ops = this.stageOps[stage.index];
      let S = Infinity;
      for (const o of ops) {
        if (o.kind !== "crew") continue;
        if (ab && ab.started[o.index]) S = Math.min(S, ab.dataTime);
        const base = o.index * P;
        for (let i = o.lo; i < o.hi; i++) if (ps[base + i] < S) S = ps[base + i];
      }
      let R = stageFinish[stage.index];
      if (R > horizon) R = horizon;
      if (!(S < R)) continue;
      if (this.twoSeason && S < W && R > W && restoredAt(ops, stage, W, fin, ps, P)) {
        this.push(j, S, W);
        let S2 = Infinity;
        for (const o of ops) {
          if (o.kind !== "crew") continue;
          const base = o.index * P;
          for (let i = o.lo; i < o.hi; i++) if (ps[base + i] >= W && ps[base + i] < S2) S2 = ps[base + i];
        }
        if (S2 < R) this.push(j, S2, R);
      } else this.push(j, S, R);
      const n = p.counts[j];
      for (let k = 0; k < n && !winterStanding; k++)
        for (let x = 0; x < this.cal.winterStarts.length; x++)
          if (p.starts[j][k] < this.cal.winterEnds[x] && p.ends[j][k] > this.cal.winterStarts[x]) winterStanding = true;
    }
    // Lane-closed hours.
    let total = 0;
    for (let j = 0; j < this.closures.length; j++) {
      let h = 0;
      for (let k = 0; k < p.counts[j]; k++) h += p.ends[j][k] - p.starts[j][k];
      this.byClosure[j] = h * popcount(this.masks[j]);
    }
    let used = 0;
    let only = -1;
    for (let j = 0; j < this.closures.length; j++)
      if (p.counts[j] > 0 && this.masks[j] !== 0) {
        used++;
        only = j;
      }
    if (used === 1) total = this.byClosure[only]; // one closure: nothing overlaps
    else if (used > 1) {
      const pc = this.pieces(-1);
      for (let k = 0; k < pc.n; k++) total += (pc.ends[k] - pc.starts[k]) * popcount(this.unionMask(pc.sets[k]));
    }
    return { total, byClosure: this.byClosure, winterStanding };
  }

  /** Lanes closed (bit mask over deck lanes) by a set of timeline closures. */
  unionMask(set: number): number {
    let m = 0;
    for (let j = 0; set; j++, set >>>= 1) if (set & 1) m |= this.masks[j];
    return m;
  }

  /**
   * Sweep the periods of the closures in `select` (bit j = closure j; −1 all) into elementary pieces, with the
   * set standing in each; consecutive pieces with the same set are joined. Scratch: valid until the next call.
   */
  pieces(select: number): Pieces {
    const p = this.periods;
    const out = this.piecesOut;
    const pos = this.pos;
    const nc = this.closures.length;
    // Closures without periods add nothing to a sweep, so two selections that agree on the rest sweep alike:
    // the total's sweep and a direction's over every closure are one sweep.
    let covered = 0;
    for (let j = 0; j < nc; j++) if ((select >>> j) & 1 && p.counts[j] > 0) covered |= 1 << j;
    if (covered === this.swept) return out;
    this.swept = covered;
    for (let j = 0; j < nc; j++) pos[j] = 0;
    let n = 0;
    let t = -Infinity;
    for (;;) {
      let set = 0;
      let next = Infinity;
      for (let j = 0; j < nc; j++) {
        if (!((select >>> j) & 1)) continue;
        const count = p.counts[j];
        let q = pos[j];
        if (q >= count) continue;
        const en = p.ends[j];
        while (q < count && en[q] <= t) q++;
        pos[j] = q;
        if (q >= count) continue;
        const st = p.starts[j][q];
        if (st <= t) {
          set |= 1 << j;
          if (en[q] < next) next = en[q];
        } else if (st < next) next = st;
      }
      if (next === Infinity) break;
      if (set !== 0) {
        if (n > 0 && out.ends[n - 1] === t && out.sets[n - 1] === set) out.ends[n - 1] = next;
        else {
          if (n === out.starts.length) this.grow(out);
          out.starts[n] = t;
          out.ends[n] = next;
          out.sets[n] = set;
          n++;
        }
      }
      t = next;
    }
    out.n = n;
    return out;
  }

  private grow(out: Pieces): void {
    out.starts = doubledF64(out.starts);
    out.ends = doubledF64(out.ends);
    out.sets = doubledI32(out.sets);
  }

  /** Lane-closed hours by day (total and per closure) of the timeline just built: for the representative iteration. */
  byDay(): { total: Float64Array; byClosure: Float64Array[]; first: number; last: number } {
    const days = this.cal.days;
    const range = Int32Array.from([days, -1]);
    const total = new Float64Array(days);
    const pc = this.pieces(-1);
    for (let k = 0; k < pc.n; k++) {
      const lanes = popcount(this.unionMask(pc.sets[k]));
      if (lanes > 0) addHoursByDay(pc.starts[k], pc.ends[k], total, 0, days, range, lanes);
    }
    const p = this.periods;
    const byClosure = this.closures.map((_, j) => {
      const out = new Float64Array(days);
      const lanes = popcount(this.masks[j]);
      const r = Int32Array.from([days, -1]);
      for (let k = 0; k < p.counts[j]; k++) addHoursByDay(p.starts[j][k], p.ends[j][k], out, 0, days, r, lanes);
      return out;
    });
    return { total, byClosure, first: range[0], last: range[1] };
  }
}

/** Every packet the stage started before W (a crew start < W) is finished by every stage operation by W. */
function restoredAt(ops: CompiledOp[], stage: ResolvedStage, W: number, fin: Float64Array, ps: Float64Array, P: number): boolean {
  for (let i = stage.lo; i < stage.hi; i++) {
    let started = false;
    for (const o of ops) if (o.kind === "crew" && ps[o.index * P + i] < W) started = true;
    if (!started) continue;
    for (const o of ops) if (!(fin[o.index * P + i] <= W)) return false;
  }
  return true;
}
