"use client";
/**
 * One shift's progress: react-hook-form with the shared zod schema (`@/lib/progress-schema`). The server's
 * rules (inside the deck, not ahead of the predecessor, not in the future) come back with field paths and
 * are shown under the field they name. Used for new entries and, with `initial` + `version`, for edits.
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { api, ApiError } from "@/lib/api-client";
import { formatStation } from "@/lib/format";
import { continuationOf, type OperationFacts } from "./entry-defaults";
import { recordedText } from "./recorded-text";
import { DISCOVERED_KINDS, DISCOVERED_LABELS, progressEntrySchema, type ProgressEntry, type ProgressEntryInput } from "@/lib/progress-schema";

export interface PlanFacts {
  startDate: string;
  today: string;
  deckFrom: number;
  deckTo: number;
  shifts: { id: string; name: string }[];
  /** Crew operations, with their shifts and where their recorded progress stopped (./entry-defaults). */
  operations: OperationFacts[];
  /** The operation of the latest recorded shift: a new entry starts on it. */
  lastOperationId: string | null;
}

/** Server paths (`discovered[0].toStationFt`) → form paths (`discovered.0.toStationFt`). */
const formPath = (p: string) => p.replace(/\[(\d+)\]/g, ".$1");
const num = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? NaN : Number(v)) };
const optionalNum = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v)) };

export function ProgressForm({
  scenarioId,
  facts,
  initial,
  entryId,
  version,
  onDone,
}: {
  scenarioId: string;
  facts: PlanFacts;
  initial?: ProgressEntryInput;
  entryId?: string;
  version?: number;
  onDone?: () => void;
}) {
  const router = useRouter();
  const editing = !!entryId;
  const deck = { from: facts.deckFrom, to: facts.deckTo };
  const calendarShifts = facts.shifts.map((s) => s.id);
  const startOp = facts.operations.find((o) => o.id === facts.lastOperationId) ?? facts.operations[0];
  const start = startOp ? continuationOf(startOp, deck, calendarShifts) : { shift: calendarShifts[0] ?? "", fromStationFt: facts.deckFrom, toStationFt: facts.deckFrom + 100 };
  const blank: ProgressEntryInput = {
    workDate: facts.today < facts.startDate ? facts.startDate : facts.today,
    shift: start.shift,
    operationId: startOp?.id ?? "",
    fromStationFt: start.fromStationFt,
    toStationFt: start.toStationFt,
    crew: "",
    tempF: null,
    rain: false,
    lostHours: 0,
    lostReason: "",
    discovered: [],
  };
  const { register, handleSubmit, control, setError, reset, formState, getValues, setValue } = useForm<ProgressEntryInput, unknown, ProgressEntry>({
    resolver: zodResolver(progressEntrySchema),
    defaultValues: initial ?? blank,
  });
  const found = useFieldArray({ control, name: "discovered" });
  const [status, setStatus] = useState<{ bad: boolean; text: string } | null>(null);
  const errors = formState.errors;
  const idp = editing ? `edit-${entryId}-` : "new-";

  const submit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      if (editing) await api(`/api/progress/${entryId}`, { method: "PUT", body: { ...values, version } });
      else await api(`/api/scenarios/${scenarioId}/progress`, { method: "POST", body: values });
      setStatus({ bad: false, text: editing ? "Saved." : recordedText(values, facts) });
      if (!editing) reset({ ...values, fromStationFt: values.toStationFt, toStationFt: Math.min(facts.deckTo, values.toStationFt + (values.toStationFt - values.fromStationFt)), lostHours: 0, lostReason: "", discovered: [] });
      router.refresh();
      onDone?.();
    } catch (e) {
      if (e instanceof ApiError && e.status === 400 && e.fields.length) {
        for (const f of e.fields) if (f.path !== "(entry)") setError(formPath(f.path) as FieldPath<ProgressEntryInput>, { type: "server", message: f.message });
        setStatus({ bad: true, text: `${e.message} ${e.fields.map((f) => f.message).join(". ")}.` });
      } else if (e instanceof ApiError && e.status === 409) {
        setStatus({ bad: true, text: `${e.message} Close the editor and open it again to see their change.` });
      } else setStatus({ bad: true, text: e instanceof Error ? e.message : String(e) });
    }
  });

  const err = (name: string) => {
    const parts = name.split(".");
    let node: unknown = errors;
    for (const p of parts) node = node && typeof node === "object" ? (node as Record<string, unknown>)[p] : undefined;
    const m = node && typeof node === "object" ? (node as { message?: string }).message : undefined;
    return m ? (
      <p className="field-error" id={`${idp}${name}-error`}>
        {m}
      </p>
    ) : null;
  };
  const aria = (name: string) => ({ id: `${idp}${name}`, "aria-describedby": `${idp}${name}-error` });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" data-testid={editing ? "progress-edit-form" : "progress-form"} aria-label={editing ? "Edit progress entry" : "Record a shift"}>
      <div className="grid gap-4 sm:grid-cols-3">
        <div>
          <label className="field-label" htmlFor={`${idp}workDate`}>
            Work date
          </label>
          <input type="date" className="field-input" min={facts.startDate} max={facts.today} {...aria("workDate")} {...register("workDate")} />
          {err("workDate")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}shift`}>
            Shift
          </label>
          <select className="field-input" {...aria("shift")} {...register("shift")}>
            {facts.shifts.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
          {err("shift")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}operationId`}>
            Operation
          </label>
          <select
            className="field-input"
            {...aria("operationId")}
            {...register("operationId", {
              // A new entry follows the chosen operation: its own shift, from where its recorded progress stopped.
              onChange: (e: { target: { value: string } }) => {
                const op = facts.operations.find((o) => o.id === e.target.value);
                if (editing || !op) return;
                const next = continuationOf(op, deck, calendarShifts, getValues("shift"));
                setValue("shift", next.shift);
                setValue("fromStationFt", next.fromStationFt);
                setValue("toStationFt", next.toStationFt);
              },
            })}
          >
            {facts.operations.map((o) => (
              <option key={o.id} value={o.id}>
                {o.name}
              </option>
            ))}
          </select>
          {err("operationId")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}fromStationFt`}>
            From station (ft or 12+50)
          </label>
          <input type="text" inputMode="decimal" className="field-input" placeholder="1250 or 12+50" {...aria("fromStationFt")} {...register("fromStationFt")} />
          {err("fromStationFt")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}toStationFt`}>
            To station (ft or 12+50)
          </label>
          <input type="text" inputMode="decimal" className="field-input" placeholder="1250 or 12+50" {...aria("toStationFt")} {...register("toStationFt")} />
          {err("toStationFt")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}crew`}>
            Crew
          </label>
          <input className="field-input" placeholder="e.g. Crew A, 6 people" {...aria("crew")} {...register("crew")} />
          {err("crew")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}tempF`}>
            Temperature observed (°F)
          </label>
          <input type="number" step="any" className="field-input" {...aria("tempF")} {...register("tempF", optionalNum)} />
          {err("tempF")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}lostHours`}>
            Lost hours
          </label>
          <input type="number" step="0.25" className="field-input" {...aria("lostHours")} {...register("lostHours", num)} />
          {err("lostHours")}
        </div>
        <div>
          <label className="field-label" htmlFor={`${idp}lostReason`}>
            Why hours were lost
          </label>
          <input className="field-input" placeholder="e.g. rain 02:00–04:00" {...aria("lostReason")} {...register("lostReason")} />
          {err("lostReason")}
        </div>
      </div>
      <p className="text-xs text-muted">
        The deck runs from {formatStation(facts.deckFrom)} ({facts.deckFrom} ft) to {formatStation(facts.deckTo)} ({facts.deckTo} ft).
      </p>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" {...register("rain")} /> Rain during the shift
      </label>
      <fieldset className="rounded-md border border-line p-3">
        <legend className="px-1 text-sm font-medium">Discovered conditions</legend>
        {found.fields.length === 0 && <p className="text-sm text-muted">None recorded for this shift.</p>}
        {found.fields.map((f, i) => (
          <div key={f.id} className="mt-2 grid items-end gap-3 sm:grid-cols-5">
            <div>
              <label className="field-label" htmlFor={`${idp}discovered.${i}.kind`}>
                Condition
              </label>
              <select className="field-input" {...aria(`discovered.${i}.kind`)} {...register(`discovered.${i}.kind`)}>
                {DISCOVERED_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {DISCOVERED_LABELS[k]}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label className="field-label" htmlFor={`${idp}discovered.${i}.fromStationFt`}>
                From (ft)
              </label>
              <input type="text" inputMode="decimal" className="field-input" placeholder="12+50" {...aria(`discovered.${i}.fromStationFt`)} {...register(`discovered.${i}.fromStationFt`)} />
              {err(`discovered.${i}.fromStationFt`)}
            </div>
            <div>
              <label className="field-label" htmlFor={`${idp}discovered.${i}.toStationFt`}>
                To (ft)
              </label>
              <input type="text" inputMode="decimal" className="field-input" placeholder="12+50" {...aria(`discovered.${i}.toStationFt`)} {...register(`discovered.${i}.toStationFt`)} />
              {err(`discovered.${i}.toStationFt`)}
            </div>
            <div>
              <label className="field-label" htmlFor={`${idp}discovered.${i}.areaSqFt`}>
                Area (ft²)
              </label>
              <input type="number" step="any" className="field-input" {...aria(`discovered.${i}.areaSqFt`)} {...register(`discovered.${i}.areaSqFt`, num)} />
              {err(`discovered.${i}.areaSqFt`)}
            </div>
            <button type="button" className="btn-secondary" onClick={() => found.remove(i)}>
              Remove
            </button>
          </div>
        ))}
        <button type="button" className="btn-secondary mt-3" onClick={() => found.append({ kind: "bottom-mat", fromStationFt: NaN, toStationFt: NaN, areaSqFt: NaN })}>
          Add a discovered condition
        </button>
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting} data-testid={editing ? "save-progress" : "record-progress"}>
          {editing ? "Save changes" : "Record shift"}
        </button>
        {onDone && (
          <button type="button" className="btn-secondary" onClick={onDone}>
            Cancel
          </button>
        )}
        {status && (
          <p role={status.bad ? "alert" : "status"} className={`text-sm ${status.bad ? "text-bad" : "text-muted"}`} data-testid="progress-status">
            {status.text}
          </p>
        )}
      </div>
    </form>
  );
}
