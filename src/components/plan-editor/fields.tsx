"use client";
/**
 * Small labelled inputs bound to the plan form by react-hook-form path. Each input's `id` and `data-testid`
 * are its form path (e.g. `operations.4.rate.dist.mode`), its label is a real `<label htmlFor>` (visually
 * hidden inside tables), and its zod error is shown under it and linked with `aria-describedby`.
 */
import { get, useController, useFormContext, useFormState, type Path } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";

export type Name = Path<ScenarioInput>;
export const n = (s: string) => s as Name;

function useFieldError(name: string): string | undefined {
  const { errors } = useFormState<ScenarioInput>({ name: n(name) });
  const e = get(errors, name) as { message?: unknown; root?: { message?: string } } | undefined;
  return typeof e?.message === "string" ? e.message : e?.root?.message;
}

interface Common {
  name: string;
  label: string;
  hideLabel?: boolean;
  srPrefix?: string;
  hint?: string;
  className?: string;
}

/** `srPrefix` names the row for screen readers ("Placement — ") while sighted users read the short label. */
function Label({ id, label, hideLabel, srPrefix }: { id: string; label: string; hideLabel?: boolean; srPrefix?: string }) {
  return (
    <label htmlFor={id} className={hideLabel ? "sr-only" : srPrefix ? "block text-xs font-medium text-muted" : "field-label"}>
      {srPrefix && <span className="sr-only">{srPrefix}</span>}
      {label}
    </label>
  );
}

function ErrorText({ id, error, hint }: { id: string; error?: string; hint?: string }) {
  return (
    <>
      {hint && !error && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="field-error">
          {error}
        </p>
      )}
    </>
  );
}

const describedBy = (id: string, error?: string, hint?: string) => (error ? `${id}-error` : hint ? `${id}-hint` : undefined);

export function NumberField({ name, label, hideLabel, srPrefix, hint, className, optional, step = "any", min, max }: Common & { optional?: boolean; step?: string; min?: number; max?: number }) {
  const { register } = useFormContext<ScenarioInput>();
  const error = useFieldError(name);
  return (
    <div className={className}>
      <Label id={name} label={label} hideLabel={hideLabel} srPrefix={srPrefix} />
      <input
        id={name}
        data-testid={name}
        type="number"
        inputMode="decimal"
        step={step}
        min={min}
        max={max}
        className="field-input min-w-[5.5rem]"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(name, error, hint)}
        {...register(n(name), { setValueAs: (v: unknown) => (v === "" || v == null ? (optional ? undefined : Number.NaN) : Number(v)) })}
      />
      <ErrorText id={name} error={error} hint={hint} />
    </div>
  );
}

export function TextField({ name, label, hideLabel, hint, className, type = "text", optional }: Common & { type?: "text" | "date"; optional?: boolean }) {
  const { register } = useFormContext<ScenarioInput>();
  const error = useFieldError(name);
  return (
    <div className={className}>
      <Label id={name} label={label} hideLabel={hideLabel} />
      <input
        id={name}
        data-testid={name}
        type={type}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(name, error, hint)}
        {...register(n(name), optional ? { setValueAs: (v: unknown) => (v === "" || v == null ? undefined : v) } : {})}
      />
      <ErrorText id={name} error={error} hint={hint} />
    </div>
  );
}

/** `optional`: the option with value "" stands for "not set" (the field is left out). */
export function SelectField({ name, label, hideLabel, srPrefix, hint, className, options, optional }: Common & { options: { value: string; label: string }[]; optional?: boolean }) {
  const { register } = useFormContext<ScenarioInput>();
  const error = useFieldError(name);
  return (
    <div className={className}>
      <Label id={name} label={label} hideLabel={hideLabel} srPrefix={srPrefix} />
      <select
        id={name}
        data-testid={name}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(name, error, hint)}
        {...register(n(name), optional ? { setValueAs: (v: unknown) => (v === "" || v == null ? undefined : v) } : {})}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <ErrorText id={name} error={error} hint={hint} />
    </div>
  );
}

export function CheckboxField({ name, label, className }: { name: string; label: string; className?: string }) {
  const { register } = useFormContext<ScenarioInput>();
  const error = useFieldError(name);
  return (
    <div className={className}>
      <label htmlFor={name} className="inline-flex items-center gap-2 text-sm">
        <input id={name} data-testid={name} type="checkbox" className="h-4 w-4 accent-brand-600" {...register(n(name))} />
        {label}
      </label>
      <ErrorText id={name} error={error} />
    </div>
  );
}

/** A set of checkboxes editing an array of primitive values (work days, shifts, lanes, day types). */
export function CheckboxGroup<T extends string | number>({ name, legend, options, hideLegend }: { name: string; legend: string; options: { value: T; label: string }[]; hideLegend?: boolean }) {
  const { control } = useFormContext<ScenarioInput>();
  const { field, fieldState } = useController({ control, name: n(name) });
  const value = (Array.isArray(field.value) ? field.value : []) as T[];
  // An error may sit on the array or on one element of it (`shifts.1: unknown shift`): show the first.
  const raw = fieldState.error as unknown as Record<string, unknown> | undefined;
  const msg = (x: unknown) => (x && typeof x === "object" && typeof (x as { message?: unknown }).message === "string" ? (x as { message: string }).message : undefined);
  const error = msg(raw) ?? msg(raw?.root) ?? Object.values(raw ?? {}).map(msg).find(Boolean);
  const toggle = (v: T) => {
    const next = value.includes(v) ? value.filter((x) => x !== v) : [...value, v];
    // Keep the order of the options, so a toggle back and forth leaves the form clean.
    const known = options.map((o) => o.value);
    field.onChange([...known.filter((x) => next.includes(x)), ...next.filter((x) => !known.includes(x))]);
  };
  return (
    <fieldset aria-describedby={error ? `${name}-error` : undefined}>
      <legend className={hideLegend ? "sr-only" : "field-label"}>{legend}</legend>
      <div className="mt-1 flex flex-wrap gap-x-3 gap-y-1">
        {options.map((o) => {
          const id = `${name}-${o.value}`;
          return (
            <label key={String(o.value)} htmlFor={id} className="inline-flex items-center gap-1.5 text-sm whitespace-nowrap">
              <input id={id} data-testid={id} type="checkbox" className="h-4 w-4 accent-brand-600" checked={value.includes(o.value)} onChange={() => toggle(o.value)} onBlur={field.onBlur} />
              {o.label}
            </label>
          );
        })}
      </div>
      <ErrorText id={name} error={error} />
    </fieldset>
  );
}

