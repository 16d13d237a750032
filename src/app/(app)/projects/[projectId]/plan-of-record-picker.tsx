"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { SaveOutcome } from "@/components/save-outcome";

/** Choose the plan of record among the project's scenarios (its administrators and engineers). */
export function PlanOfRecordPicker({ projectId, current, scenarios }: { projectId: string; current: string | null; scenarios: { id: string; name: string }[] }) {
  const router = useRouter();
  const [chosen, setChosen] = useState(current ?? "");
  const save = useMutation({
    mutationFn: () => api(`/api/projects/${projectId}/plan-of-record`, { method: "PUT", body: { planScenarioId: chosen || null } }),
    onSuccess: () => router.refresh(),
  });
  if (scenarios.length === 0) return <p className="mt-3 text-sm text-muted">Make a scenario first; then choose it here.</p>;
  return (
    <form
      className="mt-3 flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <div>
        <label htmlFor="plan-of-record" className="field-label">
          Choose a scenario
        </label>
        <select id="plan-of-record" className="field-input" value={chosen} onChange={(e) => (save.reset(), setChosen(e.target.value))}>
          <option value="">None chosen</option>
          {scenarios.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-secondary" disabled={save.isPending || chosen === (current ?? "")}>
        {save.isPending ? "Saving…" : "Make it the plan of record"}
      </button>
      <SaveOutcome saved={save.isSuccess} error={save.error} />
    </form>
  );
}
