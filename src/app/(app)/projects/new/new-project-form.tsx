"use client";
/** The new-project form: react-hook-form on the shared request contract (`projectCreateSchema`), errors beside their fields. */
import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import { useForm, type UseFormRegisterReturn } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import { projectCreateSchema } from "@/lib/schemas";
import { LIMITS } from "@sim/limits";

type Input = z.input<typeof projectCreateSchema>;
type Output = z.output<typeof projectCreateSchema>;
const FIELDS = ["name", "structureName", "region", "deckLengthFt", "startStationFt", "lanes", "description"] as const;
type FieldName = (typeof FIELDS)[number];

/** One labelled input with its hint and its problem ("Deck length must be more than 0 ft"), tied together for screen readers. */
function Field({ id, label, hint, problem, children }: { id: string; label: string; hint?: string; problem?: string; children: ReactNode }) {
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

export function NewProjectForm() {
  const router = useRouter();
  const { register, handleSubmit, formState, setError } = useForm<Input, unknown, Output>({
    resolver: zodResolver(projectCreateSchema),
    defaultValues: { name: "", structureName: "", region: "", startStationFt: "0+00", lanes: "L1, L2", description: "" },
  });
  const [failure, setFailure] = useState<string | null>(null);
  const create = useMutation({
    mutationFn: (v: Output) => api<{ id: string }>("/api/projects", { method: "POST", body: v }),
    // The project's page: it has no scenario yet and offers New scenario, whose standard template takes this deck.
    onSuccess: (r) => router.push(`/projects/${r.id}`),
    onError: (e) => setFailure(applyServerErrors(e, setError, (p) => ((FIELDS as readonly string[]).includes(p) ? (p as FieldName) : null))),
  });
  const problem = (f: FieldName) => formState.errors[f]?.message;
  const described = (f: FieldName, hint = false) => {
    const ids = [hint ? `project-${f}-hint` : "", problem(f) ? `project-${f}-error` : ""].filter(Boolean).join(" ");
    return { "aria-invalid": !!problem(f), "aria-describedby": ids || undefined };
  };
  const input = (f: FieldName, reg: UseFormRegisterReturn, props: Record<string, unknown> = {}, hint = false) => (
    <input id={`project-${f}`} className="field-input" {...described(f, hint)} {...props} {...reg} />
  );

  return (
    <form
      className="card space-y-5"
      noValidate
      onSubmit={handleSubmit((v) => {
        setFailure(null);
        create.mutate(v);
      })}
    >
      <Field id="project-name" label="Project name" problem={problem("name")}>
        {input("name", register("name"), { maxLength: LIMITS.name, placeholder: "e.g. Route 4 Heron Creek Bridge — deck overlay" })}
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="project-structureName" label="Structure" problem={problem("structureName")}>
          {input("structureName", register("structureName"), { maxLength: LIMITS.name, placeholder: "e.g. Heron Creek Bridge (northbound)" })}
        </Field>
        <Field id="project-region" label="Region (optional)" problem={problem("region")}>
          {input("region", register("region"), { maxLength: LIMITS.name, placeholder: "e.g. Marrin County" })}
        </Field>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="project-deckLengthFt" label="Deck length (ft)" problem={problem("deckLengthFt")}>
          {input("deckLengthFt", register("deckLengthFt", { valueAsNumber: true }), { type: "number", inputMode: "decimal", min: 1, max: 50_000, step: "any" })}
        </Field>
        <Field id="project-startStationFt" label="Start station" hint="Feet (1200) or a station (12+00)." problem={problem("startStationFt")}>
          {input("startStationFt", register("startStationFt"), { maxLength: 40 }, true)}
        </Field>
        <Field id="project-lanes" label="Lanes" hint="Names, separated by commas." problem={problem("lanes")}>
          {input("lanes", register("lanes"), { maxLength: 200 }, true)}
        </Field>
      </div>
      <Field id="project-description" label="Description (optional)" problem={problem("description")}>
        <textarea id="project-description" rows={3} className="field-input" maxLength={LIMITS.description} {...described("description")} {...register("description")} />
      </Field>
      {failure && (
        <p role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
          {failure}
        </p>
      )}
      <button type="submit" className="btn-primary" disabled={create.isPending}>
        {create.isPending ? "Creating…" : "Create the project"}
      </button>
    </form>
  );
}
