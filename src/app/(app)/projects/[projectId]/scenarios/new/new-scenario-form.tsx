"use client";
/** A new scenario from the standard template or as a copy: a react-hook-form form on the shared name contract. */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError, type FieldProblem } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";
import { variantSchema } from "@/lib/schemas";
import { templateScenario, type ProjectDeck } from "@/lib/scenario-template";
import { describeProblemPath } from "@/components/plan-editor/problem-labels";

const newScenarioSchema = variantSchema.extend({
  source: z.string().min(1),
  startDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date"),
});
type NewScenario = z.infer<typeof newScenarioSchema>;

export function NewScenarioForm({ projectId, deck, existing }: { projectId: string; deck: ProjectDeck; existing: { id: string; name: string }[] }) {
  const router = useRouter();
  const form = useForm<NewScenario>({
    resolver: zodResolver(newScenarioSchema),
    defaultValues: { name: "", source: "template", startDate: `${new Date().getFullYear() + 1}-04-05` },
  });
  const { register, handleSubmit, watch, formState, setError } = form;
  const source = watch("source");
  const [failure, setFailure] = useState<{ message: string | null; problems: FieldProblem[] } | null>(null);

  const create = useMutation({
    mutationFn: async (v: NewScenario) => {
      if (v.source === "template") {
        const definition = templateScenario(v.name, deck, v.startDate);
        return { definition, ...(await api<ScenarioCreatedAnswer>(`/api/projects/${projectId}/scenarios`, { method: "POST", body: { name: v.name, definition, changeNote: "Created from the standard template" } })) };
      }
      return { definition: null, ...(await api<ScenarioCreatedAnswer>(`/api/scenarios/${v.source}/variants`, { method: "POST", body: { name: v.name } })) };
    },
    onSuccess: (r) => router.push(`/scenarios/${r.id}/plan`),
    onError: (e) => {
      // Name and start date show beside their fields; anything else in the plan is named in words.
      const fieldFor = (p: string) => (p === "name" || p === "definition.name" ? "name" : p === "definition.startDate" ? "startDate" : null);
      const message = applyServerErrors(e, setError, fieldFor);
      const rest = e instanceof ApiError ? e.fields.filter((p) => !fieldFor(p.path)) : [];
      setFailure(message || rest.length ? { message: e.message, problems: rest } : null);
    },
  });
  const nameProblem = formState.errors.name?.message;
  const dateProblem = formState.errors.startDate?.message;

  return (
    <form
      className="card space-y-5"
      noValidate
      onSubmit={handleSubmit((v) => {
        setFailure(null);
        create.mutate(v);
      })}
    >
      <div>
        <label htmlFor="scenario-name" className="field-label">
          Name
        </label>
        <input id="scenario-name" className="field-input" maxLength={120} aria-invalid={!!nameProblem} aria-describedby={nameProblem ? "scenario-name-error" : undefined} {...register("name")} />
        {nameProblem && (
          <p id="scenario-name-error" className="field-error">
            Name {nameProblem}
          </p>
        )}
      </div>
      <fieldset>
        <legend className="field-label">Start from</legend>
        <div className="mt-2 space-y-2 text-sm">
          <label className="flex items-start gap-2">
            <input type="radio" value="template" className="mt-1" {...register("source")} />
            <span>
              The standard seven-operation overlay chain over this deck
              <span className="block text-muted">Setup, milling, hydrodemolition, cleanup, LMC placement, cure, restriping — placeholder rates to replace.</span>
            </span>
          </label>
          {existing.map((s) => (
            <label key={s.id} className="flex items-center gap-2">
              <input type="radio" value={s.id} {...register("source")} />
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
          <input id="scenario-start" type="date" className="field-input w-48" aria-invalid={!!dateProblem} {...register("startDate")} />
          {dateProblem && <p className="field-error">Start date {dateProblem}</p>}
        </div>
      )}
      {failure && (
        <div role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
          <p>{failure.message}</p>
          {failure.problems.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {failure.problems.map((p) => {
                const where = describeProblemPath(p.path, create.variables ? templateScenario(create.variables.name, deck, create.variables.startDate) : {});
                return (
                  <li key={p.path}>
                    {where.sectionLabel}: {where.field} — {p.message}
                  </li>
                );
              })}
            </ul>
          )}
        </div>
      )}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={create.isPending}>
          {create.isPending ? "Creating…" : "Create and open the plan"}
        </button>
      </div>
    </form>
  );
}
