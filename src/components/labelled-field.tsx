/**
 * One form field's frame: its label, the control (children), a hint and the problem in words, which reads
 * "<label> <problem>" ("Deck length (ft) must be more than 0 ft"). The control points at the hint and the
 * problem with `describedBy(id, …)`, so a screen reader reads them with it.
 */
import type { ReactNode } from "react";

/** The `aria-describedby` of the control inside a LabelledField with this id: its hint and its problem, when shown. */
export function describedBy(id: string, shown: { hint: boolean; problem: boolean }): string | undefined {
  const { hint, problem } = shown;
  return [hint ? `${id}-hint` : "", problem ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined;
}

export function LabelledField({ id, label, hint, problem, children }: { id: string; label: string; hint?: string; problem?: string; children: ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
      {problem && (
        <p id={`${id}-error`} className="field-error">
          {label} {problem}
        </p>
      )}
    </div>
  );
}
