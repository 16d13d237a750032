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
