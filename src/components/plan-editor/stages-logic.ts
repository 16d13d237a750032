/**
 * Pure helpers of the Stages section (no React, no DOM), unit-tested in tests/unit/stages-editor.test.ts.
 * Contract: `stageFormValues` makes every stage's optional fields present (so fields that mount leave the form
 * clean) and spells out the default `after` of every stage but the first (the previous stage, when it is
 * done, no lag — MODEL.md "Stages"), which means the same as leaving it out; `repairStageOrder` keeps each
 * `after` pointing at an earlier stage after a move or removal; `newStage` proposes the next stage;
 * `withoutOperation` drops a removed operation from the stages' lists; `standingMode` names how a stage's standing closure relates to its lanes; `parseStationText` reads
 * `12+50`, `STA 12+50` or feet.
 */
import type { ScenarioInput } from "@sim/schema";

export type StageValues = ScenarioInput["stages"][number];
export type AfterValues = NonNullable<StageValues["after"]>;

export const defaultAfter = (previousId: string): AfterValues => ({ stage: previousId, when: "stageDone", lagFt: 0, lagHours: 0 });

/** Optional fields present (as `undefined`, which JSON drops), `after` spelled out for every stage but the first. */
export function stageFormValues(stages: readonly StageValues[]): StageValues[] {
  return stages.map((st, i) => {
    const out: StageValues = {
      ...st,
      fromStationFt: st.fromStationFt ?? undefined,
      toStationFt: st.toStationFt ?? undefined,
      capacityVehPerHour: st.capacityVehPerHour ?? undefined,
      standingLanesClosed: st.standingLanesClosed ?? [...st.lanes],
    };
    if (i === 0) delete out.after;
    else out.after = { ...defaultAfter(stages[i - 1].id), ...st.after };
    return out;
  });
}

/** After a move or a removal: the first stage follows nothing; a stage that follows a later (or missing) stage now follows the previous one. */
export function repairStageOrder(stages: readonly StageValues[]): StageValues[] {
  return stages.map((st, i) => {
    const out = { ...st };
    if (i === 0) {
      delete out.after;
      return out;
    }
    const earlier = stages.slice(0, i).map((s) => s.id);
    const after = st.after ?? defaultAfter(stages[i - 1].id);
    out.after = earlier.includes(after.stage) ? after : { ...after, stage: stages[i - 1].id };
    return out;
  });
}

/** The next stage: the lanes no stage works on yet (all lanes when every lane is taken), behind barrier, after the last stage. */
export function newStage(stages: readonly StageValues[], deckLanes: readonly string[]): StageValues {
  const taken = new Set(stages.flatMap((s) => s.lanes ?? []));
  const free = deckLanes.filter((l) => !taken.has(l));
  const lanes = free.length ? free : [...deckLanes];
  const number = stages.length + 1;
  const last = stages[stages.length - 1];
  return {
    id: unusedId(`stage-${number}`, stages.map((s) => s.id)),
    name: `Stage ${number}`,
    lanes,
    fromStationFt: undefined,
    toStationFt: undefined,
    standingLanesClosed: [...lanes],
    capacityVehPerHour: undefined,
    ...(last ? { after: defaultAfter(last.id) } : {}),
  };
}

function unusedId(base: string, taken: readonly string[]): string {
  let id = base;
  for (let k = 2; taken.includes(id); k++) id = `${base}-${k}`;
  return id;
}

/** Stages after operation `id` is removed from the plan: it leaves every stage's own list of operations. */
export function withoutOperation(stages: readonly StageValues[], id: string): StageValues[] {
  return stages.map((st) => (st.operations?.includes(id) ? { ...st, operations: st.operations.filter((o) => o !== id) } : st));
}

export type StandingMode = "same" | "more" | "none";

export function standingMode(lanes: readonly string[] | undefined, standing: readonly string[] | undefined): StandingMode {
  if (!standing) return "same";
  if (standing.length === 0) return "none";
  const a = new Set(lanes ?? []);
  const b = new Set(standing);
  return a.size === b.size && [...a].every((l) => b.has(l)) ? "same" : "more";
}

/** `12+50`, `STA 12+50`, `1250` or `1250.5` → feet; empty → undefined; anything else → null. */
export function parseStationText(raw: string): number | undefined | null {
  const s = raw.trim().replace(/^sta\.?\s*/i, "").replace(/,/g, "");
  if (s === "") return undefined;
  const m = /^(\d+)\s*\+\s*(\d{1,2}(?:\.\d+)?)$/.exec(s);
  if (m) return Number(m[1]) * 100 + Number(m[2]);
  if (/^\d+(\.\d+)?$/.test(s)) return Number(s);
  return null;
}
