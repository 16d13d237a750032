/**
 * How far each operation has got, from the field log: feet done of the feet it has to do (over every stage it
 * works), per stage when there are several, and its shifts, hours lost and first and last shift. The feet come
 * from the same as-built reading a re-forecast starts from (sim/asbuilt.ts `buildAsBuilt`, at the last shift's
 * date), so "done" here is what the engine counts as done: overlapping shifts count once, a pass over the deck
 * belongs to the stage the re-forecast gives it. Pure.
 */
import { buildAsBuilt, type ProgressRecord } from "@sim/asbuilt";
import { resolveStages } from "@sim/stages";
import type { Scenario } from "@sim/schema";

export interface StageProgress {
  stageId: string;
  stageName: string;
  doneFt: number;
  totalFt: number;
}

export interface OperationProgress {
  id: string;
  name: string;
  doneFt: number;
  totalFt: number;
  /** One per stage the operation works, in stage order. */
  stages: StageProgress[];
  shifts: number;
  lostHours: number;
  firstDate: string | null;
  lastDate: string | null;
}

export type FieldLogRecord = ProgressRecord & { lostHours: number };

/** The latest work date in the log ("" for an empty log): what "to date" means. */
export function lastWorkDate(entries: ReadonlyArray<{ workDate: string }>): string {
  return entries.reduce((m, e) => (e.workDate > m ? e.workDate : m), "");
}

/** Crew operations in the plan's order (a wait operation such as a cure has no shifts to count). */
export function progressToDate(s: Scenario, entries: ReadonlyArray<FieldLogRecord>): OperationProgress[] {
  const last = lastWorkDate(entries) || s.startDate;
  const state = buildAsBuilt(s, entries, last);
  const { lengthFt: L, packetFt } = s.deck;
  const packetLen = (i: number) => Math.min((i + 1) * packetFt, L) - i * packetFt;
  const stages = resolveStages(s);
  return s.operations
    .filter((op) => op.kind === "crew")
    .map((op) => {
      const mine = entries.filter((e) => e.operationId === op.id);
      const perStage: StageProgress[] = [];
      for (const st of stages) {
        const built = state.ops.find((o) => o.id === op.id && o.stage === st.id);
        if (!built) continue; // the operation does not work this stage
        let doneFt = 0;
        let totalFt = 0;
        for (let i = st.lo; i < st.hi; i++) {
          totalFt += packetLen(i);
          doneFt += packetLen(i) * (1 - built.remaining[i]);
        }
        perStage.push({ stageId: st.id, stageName: st.name, doneFt, totalFt });
      }
      const dates = mine.map((e) => e.workDate).sort();
      return {
        id: op.id,
        name: op.name,
        doneFt: perStage.reduce((a, p) => a + p.doneFt, 0),
        totalFt: perStage.reduce((a, p) => a + p.totalFt, 0),
        stages: perStage,
        shifts: mine.length,
        lostHours: mine.reduce((a, e) => a + e.lostHours, 0),
        firstDate: dates[0] ?? null,
        lastDate: dates[dates.length - 1] ?? null,
      };
    });
}

/** "0 %" only when nothing is done and "100 %" only when all is: a sliver either way is not rounded away. */
export function shareText(done: number, total: number): string {
  if (total <= 0 || done <= 0) return "0 %";
  if (done >= total - 1e-6) return "100 %";
  return `${Math.min(99, Math.max(1, Math.round((100 * done) / total)))} %`;
}

/**
 * The job's progress in one sentence for the plan-of-record headline, or null for an empty log. A stage's lanes
 * are finished as far as its operation furthest behind has gone (in a chain each operation follows the one before
 * it over the same stations, so the last one's feet are the finished ones); the job's share is those feet over
 * every stage: "Progress: 36 % of the deck finished — every operation done over 3,000 of 8,400 ft; last shift in
 * the field log 4 Dec 2026."
 */
export function progressSentence(s: Scenario, entries: ReadonlyArray<FieldLogRecord>, formatDate: (iso: string) => string): string | null {
  if (entries.length === 0) return null;
  const rows = progressToDate(s, entries);
  const stages = new Map<string, { done: number; total: number }>();
  for (const r of rows) {
    for (const st of r.stages) {
      const seen = stages.get(st.stageId);
      stages.set(st.stageId, { done: seen ? Math.min(seen.done, st.doneFt) : st.doneFt, total: st.totalFt });
    }
  }
  const done = [...stages.values()].reduce((a, x) => a + x.done, 0);
  const total = [...stages.values()].reduce((a, x) => a + x.total, 0);
  if (total <= 0) return null;
  const ft = (x: number) => Math.round(x).toLocaleString("en-US");
  const whole = stages.size > 1 ? `the work of its ${stages.size} stages` : "the deck";
  const last = `; last shift in the field log ${formatDate(lastWorkDate(entries))}.`;
  const share = shareText(done, total);
  if (share === "100 %") return `Progress: every operation done over ${whole}${last}`;
  if (share === "0 %") {
    const ahead = rows.reduce((a, r) => (r.doneFt / r.totalFt > a.doneFt / a.totalFt ? r : a));
    return `Progress: under way, nothing finished yet (${ahead.name} furthest ahead, ${shareText(ahead.doneFt, ahead.totalFt)} done)${last}`;
  }
  return `Progress: ${share} of ${whole} finished — every operation done over ${ft(done)} of ${ft(total)} ft${last}`;
}
