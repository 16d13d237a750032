"use client";
/** Loads a scenario for the plan editor and shows the loading and error states; `PlanForm` does the editing. */
import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { PlanForm } from "./plan-form";
import type { ScenarioAnswer } from "@/lib/scenario-contract";

export function PlanEditor({ scenarioId }: { scenarioId: string }) {
  const query = useQuery({
    queryKey: ["scenarios", scenarioId],
    queryFn: () => api<ScenarioAnswer>(`/api/scenarios/${scenarioId}`),
  });
  // Bumped to start the form afresh from the server's copy ("keep theirs").
  const [generation, setGeneration] = useState(0);

  if (query.isPending) {
    return (
      <div className="card" aria-busy="true">
        <p className="text-sm text-muted">Loading the plan…</p>
        <div className="mt-3 grid gap-3 md:grid-cols-[12rem_1fr]">
          <div className="space-y-2">{[0, 1, 2, 3].map((i) => <div key={i} className="h-8 animate-pulse rounded bg-paper" />)}</div>
          <div className="h-64 animate-pulse rounded bg-paper" />
        </div>
      </div>
    );
  }
  if (query.isError) {
    const status = query.error instanceof ApiError ? query.error.status : 0;
    return (
      <div className="card border-bad/40" role="alert">
        <h2 className="text-bad">{status === 404 ? "This scenario no longer exists" : status === 403 ? "You cannot open this plan" : "Could not load the plan"}</h2>
        <p className="mt-1 text-sm">{query.error.message}</p>
        {status !== 404 && status !== 403 && (
          <button type="button" className="btn-secondary mt-3" onClick={() => query.refetch()}>
            Try again
          </button>
        )}
      </div>
    );
  }
  return (
    <PlanForm
      key={generation}
      data={query.data}
      onReload={async () => {
        await query.refetch();
        setGeneration((g) => g + 1);
      }}
    />
  );
}
