"use client";
/**
 * A station input bound to a number of feet in the plan form. People type `12+50`, `STA 12+50` or `1250`;
 * it shows what it read as a station. Empty means "not set" (the caller says what that stands for). Text
 * that is not a station keeps the form invalid (NaN) and says how to write one.
 */
import { useState } from "react";
import { useController, useFormContext } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";
import { formatStation } from "@/lib/format";
import { n } from "./fields";
import { parseStationText } from "./stages-logic";

export function StationField({ name, label, emptyMeans, className }: { name: string; label: string; emptyMeans: string; className?: string }) {
  const { control } = useFormContext<ScenarioInput>();
  const { field, fieldState } = useController({ control, name: n(name) });
  const value = field.value as unknown as number | undefined;
  const [text, setText] = useState(() => (typeof value === "number" && Number.isFinite(value) ? formatStation(value) : ""));
  const read = parseStationText(text);
  const problem = read === null ? "Write a station as 12+50 or as feet (1250)." : fieldState.error?.message;
  const hint = read === undefined ? emptyMeans : typeof read === "number" ? `${formatStation(read)} (${read.toLocaleString("en-US")} ft)` : undefined;
  return (
    <div className={className}>
      <label htmlFor={name} className="field-label">
        {label}
      </label>
      <input
        id={name}
        data-testid={name}
        ref={field.ref}
        type="text"
        inputMode="decimal"
        placeholder="e.g. 12+50"
        className="field-input"
        value={text}
        aria-invalid={problem ? true : undefined}
        aria-describedby={problem ? `${name}-error` : `${name}-hint`}
        onBlur={field.onBlur}
        onChange={(e) => {
          setText(e.target.value);
          const ft = parseStationText(e.target.value);
          field.onChange(ft === null ? Number.NaN : ft);
        }}
      />
      {problem ? (
        <p id={`${name}-error`} className="field-error">
          {problem}
        </p>
      ) : (
        <p id={`${name}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
    </div>
  );
}
