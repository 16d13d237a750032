"use client";
/** "Make a variant": a small inline form asking for the name, then the new scenario's plan editor. */
import { useId, useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";
import { variantSchema } from "@/lib/schemas";

export function VariantForm({ scenarioId, scenarioName, projectId }: { scenarioId: string; scenarioName: string; projectId: string }) {
  const [open, setOpen] = useState(false);
  const form = useForm<z.input<typeof variantSchema>, unknown, z.output<typeof variantSchema>>({
    resolver: zodResolver(variantSchema),
    defaultValues: { name: `${scenarioName} — variant`.slice(0, 120) },
  });
  const [other, setOther] = useState<string | null>(null);
  const router = useRouter();
  const queryClient = useQueryClient();
  const inputId = useId();
  const errorId = useId();
  const create = useMutation({
    mutationFn: (n: string) => api<ScenarioCreatedAnswer>(`/api/scenarios/${scenarioId}/variants`, { method: "POST", body: { name: n } }),
    onSuccess: async ({ id }) => {
      await queryClient.invalidateQueries({ queryKey: ["projects", projectId, "scenarios"] });
      router.push(`/scenarios/${id}/plan`);
    },
    onError: (e) => setOther(applyServerErrors(e, form.setError, (p) => (p === "name" ? "name" : null))),
  });

  if (!open) {
    return (
      <button type="button" className="btn-secondary px-2.5 py-1 text-xs normal-case tracking-normal" onClick={() => setOpen(true)} aria-label={`Make a variant of ${scenarioName}`}>
        Make a variant
      </button>
    );
  }
  const nameError = form.formState.errors.name?.message;
  const error = nameError ? `Name ${nameError}` : other;
  return (
    <form
      className="mt-1 space-y-1.5 font-normal normal-case tracking-normal"
      noValidate
      onSubmit={form.handleSubmit((v) => {
        setOther(null);
        create.mutate(v.name);
      })}
      onKeyDown={(e) => {
        if (e.key === "Escape" && !create.isPending) setOpen(false);
      }}
    >
      <label htmlFor={inputId} className="field-label text-xs">
        Name of the variant
      </label>
      <input
        id={inputId}
        className="field-input py-1.5"
        maxLength={120}
        autoFocus
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        {...form.register("name")}
      />
      {error && (
        <p id={errorId} className="field-error text-xs" role="alert">
          {error}
        </p>
      )}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary px-2.5 py-1 text-xs" disabled={create.isPending}>
          {create.isPending ? "Creating…" : "Create and edit"}
        </button>
        <button type="button" className="btn-secondary px-2.5 py-1 text-xs" disabled={create.isPending} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
