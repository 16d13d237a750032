"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { templateScenario, type ProjectDeck } from "@/lib/scenario-template";

export function NewScenarioForm({ projectId, deck, existing }: { projectId: string; deck: ProjectDeck; existing: { id: string; name: string }[] }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [source, setSource] = useState<string>("template");
  const [startDate, setStartDate] = useState(`${new Date().getFullYear() + 1}-04-05`);

  const create = useMutation({
    mutationFn: async () => {
      if (source === "template") {
        const definition = templateScenario(name, deck, startDate);
        return api<{ id: string }>(`/api/projects/${projectId}/scenarios`, { method: "POST", body: { name, definition, changeNote: "Created from the standard template" } });
      }
      return api<{ id: string }>(`/api/scenarios/${source}/variants`, { method: "POST", body: { name } });
    },
    onSuccess: (r) => router.push(`/scenarios/${r.id}/plan`),
  });
  const problems = create.error instanceof ApiError ? create.error.fields : [];
  const nameProblem = problems.find((p) => p.path === "name" || p.path === "definition.name")?.message;

  return (
    <form
      className="card space-y-5"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate();
      }}
    >
      <div>
        <label htmlFor="scenario-name" className="field-label">
          Name
        </label>
        <input id="scenario-name" className="field-input" value={name} onChange={(e) => setName(e.target.value)} maxLength={120} required aria-invalid={!!nameProblem} />
        {nameProblem && <p className="field-error">Name {nameProblem}</p>}
      </div>
      <fieldset>
        <legend className="field-label">Start from</legend>
        <div className="mt-2 space-y-2 text-sm">
          <label className="flex items-start gap-2">
            <input type="radio" name="source" value="template" checked={source === "template"} onChange={() => setSource("template")} className="mt-1" />
            <span>
              The standard seven-operation overlay chain over this deck
              <span className="block text-muted">Setup, milling, hydrodemolition, cleanup, LMC placement, cure, restriping — placeholder rates to replace.</span>
            </span>
          </label>
          {existing.map((s) => (
            <label key={s.id} className="flex items-center gap-2">
              <input type="radio" name="source" value={s.id} checked={source === s.id} onChange={() => setSource(s.id)} />
              <span>A copy of “{s.name}”</span>
            </label>
          ))}
        </div>
      </fieldset>
      {source === "template" && (
        <div>
          <label htmlFor="scenario-start" className="field-label">
            Start date
          </label>
          <input id="scenario-start" type="date" className="field-input w-48" value={startDate} onChange={(e) => setStartDate(e.target.value)} required />
        </div>
      )}
      {create.isError && (
        <div role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
          <p>{create.error.message}</p>
          {problems.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {problems.map((p) => (
                <li key={p.path}>
                  {p.path}: {p.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={create.isPending || !name.trim()}>
          {create.isPending ? "Creating…" : "Create and open the plan"}
        </button>
      </div>
    </form>
  );
}
