"use client";
/**
 * What one save of the plan changed, opened from the plan's history: the saved version and the one before it are
 * fetched when asked for (GET /api/scenarios/:id/revisions?version=N) and compared field by field in words.
 */
import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { RevisionPairAnswer } from "@/lib/scenario-contract";
import { diffDefinitions, toFormValues } from "./plan-logic";
import { DifferenceList } from "./difference-list";

function Changes({ scenarioId, version }: { scenarioId: string; version: number }) {
  const q = useQuery({
    queryKey: ["scenarios", scenarioId, "revisions", version],
    queryFn: () => api<RevisionPairAnswer>(`/api/scenarios/${scenarioId}/revisions?version=${version}`),
    staleTime: Infinity, // a saved version never changes
  });
  if (q.isPending) return <p className="mt-1 text-muted">Loading…</p>;
  if (q.isError) return <p role="alert" className="mt-1 text-bad">{q.error.message}</p>;
  const { definition, previous } = q.data;
  if (!previous) return <p className="mt-1 text-muted">The first saved version: nothing before it to compare with.</p>;
  const after = toFormValues(definition);
  const diffs = diffDefinitions(toFormValues(previous.definition), after);
  if (diffs.length === 0) return <p className="mt-1 text-muted">The same plan as version {previous.version} (saved again, perhaps with a note).</p>;
  return (
    <>
      <p className="mt-1">
        {diffs.length} {diffs.length === 1 ? "change" : "changes"} from version {previous.version}:
      </p>
      <DifferenceList diffs={diffs} values={after} testId={`revision-changes-${version}`} />
    </>
  );
}

export function RevisionChanges({ scenarioId, version }: { scenarioId: string; version: number }) {
  // Fetched only once opened: a long history costs nothing until someone asks.
  const [open, setOpen] = useState(false);
  return (
    <details className="ml-4" onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="cursor-pointer text-brand-700">What changed in v{version}</summary>
      {open && <Changes scenarioId={scenarioId} version={version} />}
    </details>
  );
}
