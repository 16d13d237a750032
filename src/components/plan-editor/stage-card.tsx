"use client";
/**
 * One stage of the Stages section: its name, lanes, stretch of deck, the lanes behind barrier while it is
 * open, its operations, how it follows an earlier stage and an optional traffic capacity. Choices that have
 * no field of their own in the scenario (the standing-closure and operations modes) are local state that
 * writes the fields they stand for.
 */
import { useEffect, useState } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";
import { formatStation } from "@/lib/format";
import { stageLabel } from "@/lib/stage-text";
import { CheckboxGroup, NumberField, SelectField, TextField, n } from "./fields";
import { StationField } from "./station-field";
import { standingMode, type StageValues, type StandingMode } from "./stages-logic";

function Choice({ name, value, checked, onChange, children }: { name: string; value: string; checked: boolean; onChange: () => void; children: React.ReactNode }) {
  const id = `${name}-${value}`;
  return (
    <label htmlFor={id} className="flex items-start gap-2 text-sm">
      <input id={id} data-testid={id} type="radio" name={name} value={value} checked={checked} onChange={onChange} className="mt-0.5 h-4 w-4 accent-brand-600" />
      <span>{children}</span>
    </label>
  );
}

export function StageCard({ i, count, readOnly, onMoveUp, onMoveDown, onRemove }: { i: number; count: number; readOnly: boolean; onMoveUp: () => void; onMoveDown: () => void; onRemove: () => void }) {
  const { control, setValue } = useFormContext<ScenarioInput>();
  const p = `stages.${i}`;
  const stage = useWatch({ control, name: n(p) }) as StageValues | undefined;
  const all = (useWatch({ control, name: "stages" }) ?? []) as StageValues[];
  const deck = useWatch({ control, name: "deck" });
  const operations = useWatch({ control, name: "operations" }) ?? [];
  const lanes = stage?.lanes ?? [];
  const laneOptions = (deck?.lanes ?? []).map((l) => ({ value: l, label: l }));
  const set = (path: string, value: unknown) => setValue(n(`${p}.${path}`), value as never, { shouldDirty: true, shouldValidate: true });

  const [mode, setMode] = useState<StandingMode>(() => standingMode(stage?.lanes, stage?.standingLanesClosed));
  // "Its own lanes" follows the lanes as they are ticked.
  const standing = stage?.standingLanesClosed;
  useEffect(() => {
    if (mode !== "same") return;
    const same = standing && standing.length === lanes.length && lanes.every((l) => standing.includes(l));
    if (!same) set("standingLanesClosed", [...lanes]);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [mode, lanes.join("\u0000")]);
  const chooseStanding = (m: StandingMode) => {
    setMode(m);
    if (m === "none") set("standingLanesClosed", []);
    else set("standingLanesClosed", [...lanes]);
  };

  const someOps = Array.isArray(stage?.operations);
  const opOptions = operations.map((o) => ({ value: o.id, label: o.name || o.id }));
  const earlier = all.slice(0, i).map((s, j) => ({ value: s.id, label: stageLabel(s.name || s.id, j) }));
  const when = stage?.after?.when ?? "stageDone";
  const deckStart = deck?.startStationFt ?? 0;
  const deckEnd = deckStart + (deck?.lengthFt ?? 0);
  const title = `Stage ${i + 1}`;

  return (
    <section className="card" aria-labelledby={`${p}-heading`} data-testid={`stage-${i}`}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <h3 id={`${p}-heading`} className="text-base">
          {stageLabel(stage?.name || "(no name)", i)}
        </h3>
        {!readOnly && (
          <div className="flex gap-2">
            <button type="button" className="btn-secondary" disabled={i === 0} onClick={onMoveUp} aria-label={`Move ${title} earlier`}>
              Earlier
            </button>
            <button type="button" className="btn-secondary" disabled={i === count - 1} onClick={onMoveDown} aria-label={`Move ${title} later`}>
              Later
            </button>
            <button type="button" className="btn-danger" disabled={count <= 1} onClick={onRemove} aria-label={`Remove ${title}`} title={count <= 1 ? "A plan needs at least one stage" : undefined}>
              Remove
            </button>
          </div>
        )}
      </div>

      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <TextField name={`${p}.name`} label="Name" hint={`Shown on charts and in exports (id: ${stage?.id ?? "—"}).`} />
        <CheckboxGroup name={`${p}.lanes`} legend="Lanes rehabilitated in this stage" options={laneOptions} />
      </div>

      <fieldset className="mt-4">
        <legend className="field-label">Stretch of deck</legend>
        <div className="mt-1 grid gap-4 sm:grid-cols-2">
          <StationField name={`${p}.fromStationFt`} label="From station" emptyMeans={`Empty: the start of the deck (${formatStation(deckStart)}).`} />
          <StationField name={`${p}.toStationFt`} label="To station" emptyMeans={`Empty: the end of the deck (${formatStation(deckEnd)}).`} />
        </div>
      </fieldset>

      <fieldset className="mt-4" data-testid={`${p}.standing`}>
        <legend className="field-label">Lanes behind barrier while the stage is open</legend>
        <div className="mt-1 space-y-1.5">
          <Choice name={`${p}.standing-mode`} value="same" checked={mode === "same"} onChange={() => chooseStanding("same")}>
            Its own lanes{lanes.length ? ` (${lanes.join(", ")})` : ""}, round the clock until they are restored
          </Choice>
          <Choice name={`${p}.standing-mode`} value="more" checked={mode === "more"} onChange={() => chooseStanding("more")}>
            More lanes than it works on (e.g. a buffer lane beside the work)
          </Choice>
          <Choice name={`${p}.standing-mode`} value="none" checked={mode === "none"} onChange={() => chooseStanding("none")}>
            None — short-term closures only
          </Choice>
        </div>
        {mode === "more" && (
          <div className="mt-2 pl-6">
            <CheckboxGroup name={`${p}.standingLanesClosed`} legend="Lanes behind barrier (must include the stage's lanes)" options={laneOptions} />
          </div>
        )}
        <p className="mt-2 text-xs text-muted">
          {mode === "none"
            ? "No barrier stays up: lanes close only while a crew works under its operation's short-term closure (set in Crews and rates; closure windows in Calendar and closures), and the deck carries traffic between shifts. Only for work that leaves the deck drivable at the end of each shift."
            : "These lanes count as closed from the stage's first set-up until its last packet is restored — every hour in between, whether or not a crew is working. Short-term closures stack on top."}
        </p>
      </fieldset>

      <fieldset className="mt-4">
        <legend className="field-label">Operations in this stage</legend>
        <div className="mt-1 space-y-1.5">
          <Choice name={`${p}.ops-mode`} value="all" checked={!someOps} onChange={() => set("operations", undefined)}>
            Every operation of the plan, in the sequence&apos;s order
          </Choice>
          <Choice name={`${p}.ops-mode`} value="some" checked={someOps} onChange={() => set("operations", operations.map((o) => o.id))}>
            Only some operations
          </Choice>
        </div>
        {someOps && (
          <div className="mt-2 pl-6">
            <CheckboxGroup name={`${p}.operations`} legend={`Operations that run in ${title}`} hideLegend options={opOptions} />
          </div>
        )}
      </fieldset>

      <fieldset className="mt-4">
        <legend className="field-label">When it starts</legend>
        {i === 0 ? (
          <p className="mt-1 text-sm text-muted">The first stage starts on the plan&apos;s start date.</p>
        ) : (
          <>
            <div className="mt-1 grid gap-4 sm:grid-cols-2">
              <SelectField name={`${p}.after.stage`} label="Follows" options={earlier} />
              <SelectField
                name={`${p}.after.when`}
                label="Starts"
                options={[
                  { value: "stageDone", label: "after that stage is finished" },
                  { value: "restoredAhead", label: "once that stage is restored ahead, by a distance and time lag" },
                ]}
              />
              <NumberField name={`${p}.after.lagHours`} label="Time lag (h)" min={0} hint={when === "stageDone" ? "Hours to move barrier and switch traffic after the earlier stage is finished." : "Hours after the earlier stage is restored at a station."} />
              {when === "restoredAhead" && <NumberField name={`${p}.after.lagFt`} label="Distance lag (ft)" min={0} hint="How far this stage stays behind the earlier stage's restored deck." />}
            </div>
            <p className="mt-2 text-xs text-muted">
              {when === "stageDone"
                ? "Nothing in this stage starts until every operation of the earlier stage has finished."
                : "This stage's first operations follow the earlier stage's last operations along the deck, like a link between operations: a station is worked once the earlier stage has restored it (plus the lags)."}
            </p>
          </>
        )}
      </fieldset>

      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <NumberField
          name={`${p}.capacityVehPerHour`}
          label="Traffic capacity past this stage (veh/h per direction, optional)"
          optional
          min={0}
          hint="Empty: computed from the lanes left open. Set it when traffic moves to a crossover or a shoulder."
        />
      </div>
    </section>
  );
}
