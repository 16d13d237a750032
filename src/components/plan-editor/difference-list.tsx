"use client";
/**
 * Differences between two plans, each named by its section and field in words ("Crews and rates: LMC placement —
 * production rate, most likely: 400 → 450"): the conflict dialog's "theirs → yours" and the history's "what this
 * save changed". `values`: the form values the field labels are read against (the later plan).
 */
import type { Difference } from "./plan-logic";
import { describeProblemPath } from "./problem-labels";

const SHOWN = 60;

export function DifferenceList({ diffs, values, testId }: { diffs: Difference[]; values: unknown; testId: string }) {
  return (
    <ul className="mt-2 max-h-64 overflow-auto rounded-md border border-line font-mono text-xs" data-testid={testId}>
      {diffs.slice(0, SHOWN).map((d) => {
        const where = describeProblemPath(d.path, values);
        return (
          <li key={d.path} className="border-b border-line px-3 py-1.5 last:border-b-0">
            <span className="font-sans text-muted">{where.sectionLabel}:</span> <span className="font-sans font-semibold">{where.field}</span>: {d.before} → {d.after}
          </li>
        );
      })}
      {diffs.length > SHOWN && <li className="px-3 py-1.5 text-muted">…and {diffs.length - SHOWN} more</li>}
    </ul>
  );
}
