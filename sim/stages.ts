/**
 * Stages resolved for the engine, validation and summaries (MODEL.md, "Stages"). Contract:
 * `resolveStages(scenario)` fills every default — station range = the whole deck, `after` = the previous stage
 * when it is done, operations = all of them in the scenario's order — and turns stations into deck packets:
 * a stage's packets are those whose start offset lies in its range, always a contiguous run `[lo, hi)`.
 * Assumes a scenario that passed validation (ids resolve, `after` names an earlier stage).
 */
import type { Scenario } from "./schema";

export interface ResolvedStage {
  index: number;
  id: string;
  name: string;
  lanes: string[];
  /** Lanes behind barrier while the stage is open ([] = no standing closure). */
  standing: string[];
  /** Station range as deck offsets, [fromFt, toFt). */
  fromFt: number;
  toFt: number;
  /** Deck packets [lo, hi) whose start offset lies in the range (lo = hi: none). */
  lo: number;
  hi: number;
  /** Scenario operation indices, in the scenario's order. */
  ops: number[];
  /** Index of the earlier stage it follows, or null for the first stage. */
  after: { stage: number; when: "stageDone" | "restoredAhead"; lagFt: number; lagHours: number } | null;
  capacityVehPerHour: number | undefined;
}

/** Packets [lo, hi) whose start offset i·packetFt lies in [fromFt, toFt). */
export function packetRange(fromFt: number, toFt: number, packetFt: number, packets: number): { lo: number; hi: number } {
  let lo = Math.max(0, Math.ceil(fromFt / packetFt - 1e-9));
  let hi = Math.min(packets, Math.ceil(toFt / packetFt - 1e-9));
  if (lo > packets) lo = packets;
  if (hi < lo) hi = lo;
  return { lo, hi };
}

export function resolveStages(s: Scenario): ResolvedStage[] {
  const { startStationFt: s0, lengthFt, packetFt } = s.deck;
  const packets = Math.ceil(lengthFt / packetFt);
  const ids = new Map(s.stages.map((st, i) => [st.id, i]));
  return s.stages.map((st, i) => {
    const fromFt = st.fromStationFt !== undefined ? st.fromStationFt - s0 : 0;
    const toFt = st.toStationFt !== undefined ? st.toStationFt - s0 : lengthFt;
    const wanted = st.operations ? new Set(st.operations) : null;
    const ops: number[] = [];
    s.operations.forEach((op, oi) => {
      if (!wanted || wanted.has(op.id)) ops.push(oi);
    });
    let after: ResolvedStage["after"] = null;
    if (st.after) after = { stage: ids.get(st.after.stage) ?? i - 1, when: st.after.when, lagFt: st.after.lagFt, lagHours: st.after.lagHours };
    else if (i > 0) after = { stage: i - 1, when: "stageDone", lagFt: 0, lagHours: 0 };
    return {
      index: i,
      id: st.id,
      name: st.name,
      lanes: st.lanes,
      standing: st.standingLanesClosed,
      fromFt,
      toFt,
      ...packetRange(fromFt, toFt, packetFt, packets),
      ops,
      after,
      capacityVehPerHour: st.capacityVehPerHour,
    };
  });
}

/** Stage pairs whose standing closures may stand at the same time: all but those ordered by a chain of `stageDone`. */
export function stagesMayOverlap(stages: ResolvedStage[]): boolean[][] {
  const n = stages.length;
  // doneBefore[a][b]: b starts only after a is done (a chain of stageDone links from a to b).
  const doneBefore = stages.map(() => new Array<boolean>(n).fill(false));
  for (const st of stages) {
    if (!st.after || st.after.when !== "stageDone") continue;
    const a = st.after.stage;
    doneBefore[a][st.index] = true;
    for (let x = 0; x < n; x++) if (doneBefore[x][a]) doneBefore[x][st.index] = true;
  }
  return stages.map((_, a) => stages.map((__, b) => a === b || !(doneBefore[a][b] || doneBefore[b][a])));
}
