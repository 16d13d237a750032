/**
 * The as-built state of a deck at a data date, from field progress records (MODEL.md, "Re-forecast").
 * Contract: `buildAsBuilt(scenario, records, dataDate)` is a pure function of its arguments. It reads only the
 * records dated on or before the data date and returns plain numbers (it crosses the API as JSON):
 * per crew operation and packet the share still to do (0 = done) and, for a done packet, its finish (the end of
 * the last recorded shift that touched it); wait packets curing at the data date; the discovered conditions so
 * far; and the updated discovery probability of every packet (beta-binomial, stated in MODEL.md).
 * `compileAsBuilt` turns a state into the typed arrays the engine reads; `withDiscovery` returns the scenario
 * whose survey carries the updated probabilities (the same object when nothing was inspected, so a
 * re-forecast with no progress draws exactly the plan's samples).
 */
import { seasonAt, type CompiledCalendar } from "./calendar";
import { parseIsoDate } from "./dates";
import { packetProbabilities } from "./samples";
import type { Distribution, Scenario } from "./schema";
import { resolveStages, type ResolvedStage } from "./stages";

export interface DiscoveredItem {
  kind: string;
  fromStationFt: number;
  toStationFt: number;
  areaSqFt: number;
}

/** One shift's recorded progress (stations are absolute feet, like `deck.startStationFt`). */
export interface ProgressRecord {
  workDate: string;
  shift: string;
  operationId: string;
  fromStationFt: number;
  toStationFt: number;
  discovered?: DiscoveredItem[];
  /** The stage the work belongs to; absent: the first stage whose range holds the start station and whose work there is not yet covered. */
  stage?: string;
}

/** The survey counts as much as this many inspected packets (a judgement, no published source). */
export const DISCOVERY_PRIOR_PACKETS = 20;

/** One stage operation's progress (stage operations in the engine's order: stage by stage). */
export interface AsBuiltOp {
  id: string;
  stage: string;
  kind: "crew" | "wait";
  /** Per packet: share of its length still to do, 0 (done) … 1 (untouched); always 1 for wait operations. */
  remaining: number[];
  /** Per packet: finish of a done packet, hours since 00:00 of startDate; null when not done. */
  finish: (number | null)[];
  /** Start and end of the operation's latest recorded shift (hours); null when nothing is recorded. */
  lastShiftStart: number | null;
  lastShiftEnd: number | null;
}

export interface AsBuiltState {
  dataDate: string;
  /** 24:00 of the data date, hours since 00:00 of startDate (never below 0): the forecast starts here. */
  dataTime: number;
  entriesUsed: number;
  ops: AsBuiltOp[];
  /** Wait packets whose predecessors are done and whose nominal duration has not passed at the data time. */
  curing: { op: string; stage: string; packet: number; since: number; nominalFinish: number }[];
  discovered: { items: number; areaSqFt: number; byKind: Record<string, number> };
  discovery: {
    priorPackets: number;
    /** Packets done by a discovering operation, and those of them with a recorded discovered condition. */
    inspected: number;
    found: number;
    /** Per packet: the plan's probability and the updated one used for the rest of the deck. */
    prior: number[];
    updated: number[];
  };
}

const EPS = 1e-6;

/** Hours since 00:00 of startDate at which a shift of `workDate` starts. */
export function shiftStartHours(s: Scenario, workDate: string, shiftId: string): number | null {
  const shift = s.calendar.shifts.find((x) => x.id === shiftId);
  if (!shift) return null;
  return 24 * (parseIsoDate(workDate) - parseIsoDate(s.startDate)) + shift.startHour;
}

/** Sorted, merged union of half-open ranges. */
export function unionRanges(ranges: ReadonlyArray<readonly [number, number]>): [number, number][] {
  const sorted = ranges.filter(([a, b]) => b > a).map(([a, b]) => [a, b] as [number, number]).sort((x, y) => x[0] - y[0]);
  const out: [number, number][] = [];
  for (const [a, b] of sorted) {
    const last = out[out.length - 1];
    if (last && a <= last[1] + EPS) last[1] = Math.max(last[1], b);
    else out.push([a, b]);
  }
  return out;
}

/** Length of [a, b) covered by a merged union. */
export function coveredLength(union: ReadonlyArray<readonly [number, number]>, a: number, b: number): number {
  let n = 0;
  for (const [x, y] of union) n += Math.max(0, Math.min(b, y) - Math.max(a, x));
  return n;
}

function nominal(d: Distribution): number {
  if (d.type === "fixed") return d.value;
  if (d.type === "lognormal") return d.median;
  return d.mode;
}

export function buildAsBuilt(s: Scenario, records: ReadonlyArray<ProgressRecord>, dataDate: string): AsBuiltState {
  const { startStationFt: s0, lengthFt: L, packetFt } = s.deck;
  const P = Math.ceil(L / packetFt);
  const day0 = parseIsoDate(s.startDate);
  const dataTime = Math.max(0, 24 * (parseIsoDate(dataDate) - day0 + 1));
  const lastDay = parseIsoDate(dataDate);
  const used = records.filter((r) => parseIsoDate(r.workDate) <= lastDay);
  const shiftLen = new Map(s.calendar.shifts.map((x) => [x.id, x.lengthHours]));
  const pStart = (i: number) => i * packetFt;
  const pEnd = (i: number) => Math.min((i + 1) * packetFt, L);

  const stageOps = resolveStages(s).flatMap((st) => st.ops.map((oi) => ({ st, oi, op: s.operations[oi] })));
  const mineOf = assignRecords(s, stageOps, used.filter((r) => shiftLen.has(r.shift)));
  const ops: AsBuiltOp[] = stageOps.map(({ st, op }, k) => {
    const mine = op.kind === "crew" ? mineOf[k] : [];
    const spans = mine.map((r) => {
      const start = shiftStartHours(s, r.workDate, r.shift)!;
      return { a: r.fromStationFt - s0, b: r.toStationFt - s0, start, end: start + shiftLen.get(r.shift)! };
    });
    const union = unionRanges(spans.map((x) => [Math.max(0, x.a), Math.min(L, x.b)] as [number, number]));
    const remaining: number[] = [];
    const finish: (number | null)[] = [];
    for (let i = 0; i < P; i++) {
      if (i < st.lo || i >= st.hi) {
        remaining.push(1); // not this stage's packet
        finish.push(null);
        continue;
      }
      const len = pEnd(i) - pStart(i);
      const left = 1 - coveredLength(union, pStart(i), pEnd(i)) / len;
      const rem = left * len < EPS ? 0 : Math.min(1, left);
      remaining.push(rem);
      if (rem > 0) {
        finish.push(null);
        continue;
      }
      let f = -Infinity;
      for (const x of spans) if (Math.min(pEnd(i), x.b) - Math.max(pStart(i), x.a) > EPS && x.end > f) f = x.end;
      finish.push(f);
    }
    let lastShiftStart: number | null = null;
    let lastShiftEnd: number | null = null;
    for (const x of spans) {
      if (lastShiftEnd === null || x.end > lastShiftEnd) lastShiftEnd = x.end;
      if (lastShiftStart === null || x.start > lastShiftStart) lastShiftStart = x.start;
    }
    return { id: op.id, stage: st.id, kind: op.kind, remaining, finish, lastShiftStart, lastShiftEnd };
  });

  const curing = curingPackets(s, ops, dataTime, P);

  const items = used.flatMap((r) => r.discovered ?? []);
  const byKind: Record<string, number> = {};
  let areaSqFt = 0;
  for (const it of items) {
    byKind[it.kind] = (byKind[it.kind] ?? 0) + 1;
    areaSqFt += it.areaSqFt;
  }

  // Beta-binomial update, pooled over the deck: each packet's prior Beta(n0·p, n0·(1 − p)) has the plan's
  // probability p as its mean; the evidence is "found of inspected" packets done by a discovering operation.
  const prior = Array.from(packetProbabilities(s));
  let inspected = 0;
  let found = 0;
  for (let i = 0; i < P; i++) {
    const a = s0 + pStart(i);
    const b = s0 + pEnd(i);
    // Every stage-operation pair that discovers (a packet outside a pair's stage reads remaining 1).
    const discovering = stageOps.map(({ op }, k) => (op.kind === "crew" && op.discovers ? ops[k].remaining[i] : 1));
    const done = discovering.some((r) => r === 0);
    const worked = discovering.some((r) => r < 1);
    const hasItem = items.some((it) => Math.min(b, it.toStationFt) - Math.max(a, it.fromStationFt) > EPS);
    // A packet partly worked by a discovering operation with a condition recorded in it has shown what it
    // holds: it counts as inspected, so "found" never exceeds "inspected" (MODEL.md, "Re-forecast").
    if (!done && !(worked && hasItem)) continue;
    inspected++;
    if (hasItem) found++;
  }
  const n0 = DISCOVERY_PRIOR_PACKETS;
  const updated = inspected === 0 ? prior.slice() : prior.map((p) => (n0 * p + found) / (n0 + inspected));

  return {
    dataDate,
    dataTime,
    entriesUsed: used.length,
    ops,
    curing,
    discovered: { items: items.length, areaSqFt, byKind },
    discovery: { priorPackets: n0, inspected, found, prior, updated },
  };
}

/** Wait packets whose crew predecessors (in the same stage) are done by the data time and whose nominal duration has not passed. */
function curingPackets(s: Scenario, ops: AsBuiltOp[], dataTime: number, P: number): AsBuiltState["curing"] {
  const out: AsBuiltState["curing"] = [];
  ops.forEach((ab) => {
    const op = s.operations.find((o) => o.id === ab.id)!;
    if (op.kind !== "wait") return;
    const mine = new Map(ops.filter((o) => o.stage === ab.stage).map((o) => [o.id, o]));
    const links = s.links.filter((l) => l.to === op.id && mine.has(l.from));
    if (links.length === 0) return;
    for (let i = 0; i < P; i++) {
      let since = -Infinity;
      let ready = true;
      for (const l of links) {
        const f = mine.get(l.from)!.finish[i];
        if (f === null) ready = false;
        else since = Math.max(since, f + l.lagHours);
      }
      if (!ready || since > dataTime) continue;
      const nominalFinish = since + nominal(op.durationHours);
      if (nominalFinish > dataTime) out.push({ op: op.id, stage: ab.stage, packet: i, since, nominalFinish });
    }
  });
  return out;
}

/**
 * Records per stage operation (MODEL.md, "Re-forecast", Stages): a record naming its stage goes there; otherwise
 * to the first stage (in stage order) with its operation whose range holds the record's start station and whose
 * records so far do not yet cover the record's stretch inside that range (failing that, the first such stage,
 * the first whose range the record overlaps, or the first with its operation). Records are taken in time order.
 */
function assignRecords(s: Scenario, stageOps: { st: ResolvedStage; oi: number; op: Scenario["operations"][number] }[], records: ProgressRecord[]): ProgressRecord[][] {
  const s0 = s.deck.startStationFt;
  const out: ProgressRecord[][] = stageOps.map(() => []);
  const time = (r: ProgressRecord) => shiftStartHours(s, r.workDate, r.shift) ?? 0;
  const sorted = records.map((r, i) => ({ r, i, t: time(r) })).sort((a, b) => a.t - b.t || a.i - b.i);
  for (const { r } of sorted) {
    const mine = stageOps.map((x, k) => ({ ...x, k })).filter((x) => x.op.id === r.operationId && x.op.kind === "crew");
    let pick: number | undefined;
    if (r.stage !== undefined) pick = mine.find((x) => x.st.id === r.stage)?.k;
    else {
      const a = r.fromStationFt - s0;
      const b = r.toStationFt - s0;
      const holding = mine.filter((x) => a >= x.st.fromFt && a < x.st.toFt);
      const open = holding.find((x) => {
        const lo = Math.max(a, x.st.fromFt);
        const hi = Math.min(b, x.st.toFt);
        const union = unionRanges(out[x.k].map((q) => [q.fromStationFt - s0, q.toStationFt - s0] as [number, number]));
        return coveredLength(union, lo, hi) < hi - lo - EPS;
      });
      pick = (open ?? holding[0] ?? mine.find((x) => Math.min(b, x.st.toFt) > Math.max(a, x.st.fromFt)) ?? mine[0])?.k;
    }
    if (pick !== undefined) out[pick].push(r);
  }
  return out;
}

/** What the engine reads from an as-built state (typed arrays, op-major like the engine's finish array). */
export interface CompiledAsBuilt {
  dataTime: number;
  /** remaining[op · P + i]: share of the packet still to do; 0 = done. */
  remaining: Float64Array;
  /** doneFinish[op · P + i]: the recorded finish of a done packet; NaN otherwise. */
  doneFinish: Float64Array;
  /** Per op: when its crews are free (the data time, or the end of its latest recorded shift if later). */
  crewFree: Float64Array;
  /** Per op: 1 when the operation has recorded progress (its crews are mobilized). */
  started: Uint8Array;
  /** Per op: the season of its latest recorded shift (a winter since then means remobilizing). */
  crewSeason: Int32Array;
  /** The latest done finish at or before the first winter's start; NaN when none. */
  season1End: number;
}

export function compileAsBuilt(s: Scenario, state: AsBuiltState, cal: CompiledCalendar, packets: number, stageOps: ReadonlyArray<{ id: string; stageId: string }>): CompiledAsBuilt {
  if (state.ops.length !== stageOps.length || state.ops.some((o, i) => o.id !== stageOps[i].id || o.stage !== stageOps[i].stageId || o.remaining.length !== packets)) {
    throw new Error("the as-built state belongs to a different scenario (stages, operations or packets differ)");
  }
  const n = stageOps.length;
  const remaining = new Float64Array(n * packets).fill(1);
  const doneFinish = new Float64Array(n * packets).fill(NaN);
  const crewFree = new Float64Array(n);
  const started = new Uint8Array(n);
  const crewSeason = new Int32Array(n);
  let season1End = NaN;
  state.ops.forEach((o, oi) => {
    crewFree[oi] = Math.max(state.dataTime, o.lastShiftEnd ?? 0);
    if (o.kind !== "crew") return;
    if (o.lastShiftStart !== null) {
      started[oi] = 1;
      crewSeason[oi] = seasonAt(cal, o.lastShiftStart);
    }
    for (let i = 0; i < packets; i++) {
      remaining[oi * packets + i] = o.remaining[i];
      const f = o.finish[i];
      if (o.remaining[i] === 0 && f !== null) {
        doneFinish[oi * packets + i] = f;
        if (f <= cal.firstWinterStart && !(f <= season1End)) season1End = f;
      }
    }
  });
  return { dataTime: state.dataTime, remaining, doneFinish, crewFree, started, crewSeason, season1End };
}

/** The scenario with the updated discovery probabilities as one survey range per packet. */
export function withDiscovery(s: Scenario, state: AsBuiltState): Scenario {
  const { prior, updated } = state.discovery;
  if (updated.every((p, i) => p === prior[i])) return s;
  const { startStationFt: s0, packetFt } = s.deck;
  // Both ends use the same formula as packetProbabilities' station, so each packet finds its own range.
  const survey = updated.map((probability, i) => ({ fromStationFt: s0 + i * packetFt, toStationFt: s0 + (i + 1) * packetFt, probability }));
  return { ...s, deck: { ...s.deck, survey } };
}
