"use client";
/** "Make a variant": a small inline form asking for the name, then the new scenario's plan editor. */
import { useId, useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";

export function VariantForm({ scenarioId, scenarioName, projectId }: { scenarioId: string; scenarioName: string; projectId: string }) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState(`${scenarioName} — variant`.slice(0, 120));
  const router = useRouter();
  const queryClient = useQueryClient();
  const inputId = useId();
  const errorId = useId();
  const create = useMutation({
    mutationFn: (n: string) => api<{ id: string }>(`/api/scenarios/${scenarioId}/variants`, { method: "POST", body: { name: n } }),
    onSuccess: async ({ id }) => {
      await queryClient.invalidateQueries({ queryKey: ["projects", projectId, "scenarios"] });
      router.push(`/scenarios/${id}/plan`);
    },
  });

  if (!open) {
    return (
      <button type="button" className="btn-secondary px-2.5 py-1 text-xs normal-case tracking-normal" onClick={() => setOpen(true)} aria-label={`Make a variant of ${scenarioName}`}>
        Make a variant
      </button>
    );
  }
  const error = create.error instanceof ApiError ? (create.error.fields.find((f) => f.path === "name")?.message ?? create.error.message) : create.error?.message;
  return (
    <form
      className="mt-1 space-y-1.5 font-normal normal-case tracking-normal"
      onSubmit={(e) => {
        e.preventDefault();
        if (name.trim()) create.mutate(name.trim());
      }}
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
        value={name}
        maxLength={120}
        required
        autoFocus
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        onChange={(e) => setName(e.target.value)}
      />
      {error && (
        <p id={errorId} className="field-error text-xs" role="alert">
          {error}
        </p>
      )}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary px-2.5 py-1 text-xs" disabled={create.isPending || !name.trim()}>
          {create.isPending ? "Creating…" : "Create and edit"}
        </button>
        <button type="button" className="btn-secondary px-2.5 py-1 text-xs" disabled={create.isPending} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
