"use client";
/** Edits one distribution (`fixed | triangular | pert | lognormal`) at a form path; switching type keeps the central value. */
import { useFormContext, useWatch } from "react-hook-form";
import type { Distribution, ScenarioInput } from "@sim/schema";
import { NumberField, n } from "./fields";
import { convertDist } from "./plan-logic";

const TYPES: { value: Distribution["type"]; label: string }[] = [
  { value: "fixed", label: "Fixed" },
  { value: "triangular", label: "Triangular" },
  { value: "pert", label: "PERT" },
  { value: "lognormal", label: "Lognormal" },
];

export function DistributionFields({ base, who, unit }: { base: string; who: string; unit: string }) {
  const { setValue, control } = useFormContext<ScenarioInput>();
  const dist = useWatch({ control, name: n(base) }) as Distribution | undefined;
  if (!dist) return null;
  const typeId = `${base}.type`;
  const field = (key: string, label: string) => (
    <NumberField key={key} name={`${base}.${key}`} srPrefix={`${who} — `} label={`${label}${key === "sigma" ? "" : ` (${unit})`}`} className="w-24" min={0} />
  );
  return (
    <div className="flex flex-wrap items-start gap-2">
      <div className="w-32">
        <label htmlFor={typeId} className="block text-xs font-medium text-muted">
          <span className="sr-only">{who} — </span>distribution
        </label>
        <select
          id={typeId}
          data-testid={typeId}
          className="field-input"
          value={dist.type}
          onChange={(e) => setValue(n(base), convertDist(dist, e.target.value as Distribution["type"]) as never, { shouldDirty: true, shouldValidate: true })}
        >
          {TYPES.map((t) => (
            <option key={t.value} value={t.value}>
              {t.label}
            </option>
          ))}
        </select>
      </div>
      {dist.type === "fixed" && field("value", "value")}
      {(dist.type === "triangular" || dist.type === "pert") && (
        <>
          {field("min", "min")}
          {field("mode", "mode")}
          {field("max", "max")}
        </>
      )}
      {dist.type === "lognormal" && (
        <>
          {field("median", "median")}
          {field("sigma", "sigma (log scale)")}
        </>
      )}
    </div>
  );
}
