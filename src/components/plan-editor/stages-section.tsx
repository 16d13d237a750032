"use client";
/**
 * Section "Stages": the work in the order it is built (MODEL.md, "Stages"). Each stage is a card
 * (./stage-card); this section adds, removes and reorders them, keeping every "follows" link pointing at an
 * earlier stage.
 */
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";
import { formatStation } from "@/lib/format";
import { StageCard } from "./stage-card";
import { newStage, repairStageOrder, type StageValues } from "./stages-logic";

export function StagesSection({ readOnly }: { readOnly: boolean }) {
  const { control, getValues } = useFormContext<ScenarioInput>();
  const stages = useFieldArray({ control, name: "stages", keyName: "key" });
  const deck = useWatch({ control, name: "deck" });
  const lanes = deck?.lanes ?? [];
  const current = () => (getValues("stages") ?? []) as StageValues[];

  const move = (from: number, to: number) => {
    const list = [...current()];
    const [st] = list.splice(from, 1);
    list.splice(to, 0, st);
    stages.replace(repairStageOrder(list));
  };
  const remove = (i: number) => {
    const list = current().filter((_, j) => j !== i);
    stages.replace(repairStageOrder(list));
  };

  return (
    <div className="space-y-5">
      <section className="card" aria-labelledby="stages-heading">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div className="max-w-3xl">
            <h2 id="stages-heading">Stages</h2>
            <p className="mt-1 text-sm">
              The work in the order it is built. A stage rehabilitates some lanes over a stretch of the deck. While a stage is open, the lanes it needs stay
              behind barrier round the clock — nights, weekends and holidays included — until they are restored (finished, restriped and reopened).
            </p>
            <p className="mt-1 text-sm text-muted">
              A simple plan is one stage over every lane. To keep the crossing open, work one lane (or a pair) at a time: one stage per lane group. This deck runs
              from {deck ? `${formatStation(deck.startStationFt ?? 0)} to ${formatStation((deck.startStationFt ?? 0) + (deck.lengthFt ?? 0))}` : "—"} with lanes{" "}
              {lanes.join(", ") || "—"}.
            </p>
          </div>
          {!readOnly && (
            <button type="button" className="btn-secondary" data-testid="add-stage" onClick={() => stages.append(newStage(current(), lanes))}>
              Add stage
            </button>
          )}
        </div>
      </section>
      <ol className="space-y-5" aria-label="Stages in building order">
        {stages.fields.map((f, i) => (
          <li key={f.key}>
            <StageCard
              i={i}
              count={stages.fields.length}
              readOnly={readOnly}
              onMoveUp={() => move(i, i - 1)}
              onMoveDown={() => move(i, i + 1)}
              onRemove={() => remove(i)}
            />
          </li>
        ))}
      </ol>
    </div>
  );
}
