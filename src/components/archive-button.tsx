"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ConfirmDialog } from "./confirm-dialog";

/**
 * Archive a project (after a confirmation that says what it does) or restore it (at once: restoring takes
 * nothing away). Its administrators only; the page decides whether to show it.
 */
export function ArchiveButton({ projectId, archived, projectName }: { projectId: string; archived: boolean; projectName?: string }) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const change = useMutation({
    mutationFn: (to: boolean) => api(`/api/projects/${projectId}/archive`, { method: "PUT", body: { archived: to } }),
    onSuccess: () => {
      setConfirming(false);
      router.refresh();
    },
  });
  if (archived)
    return (
      <div>
        <button type="button" className="btn-secondary" disabled={change.isPending} onClick={() => change.mutate(false)} data-testid="restore-project">
          {change.isPending ? "Restoring…" : "Restore project"}
        </button>
        {change.isError && (
          <p role="alert" className="field-error">
            {change.error.message}
          </p>
        )}
      </div>
    );
  return (
    <>
      <button type="button" className="btn-secondary" onClick={() => (change.reset(), setConfirming(true))} data-testid="archive-project">
        Archive project…
      </button>
      {confirming && (
        <ConfirmDialog
          title={`Archive ${projectName ?? "this project"}?`}
          confirmLabel="Archive the project"
          busyLabel="Archiving…"
          busy={change.isPending}
          error={change.isError ? change.error.message : null}
          onConfirm={() => change.mutate(true)}
          onCancel={() => setConfirming(false)}
          testId="archive-dialog"
        >
          <p>
            Everything is kept — plans, runs, the field log, members and share links — and everyone on the project can still read it. Nothing in it can be
            changed, run or published, and its daily e-mails stop, until an administrator restores it. It moves to the archived projects on your project list.
          </p>
        </ConfirmDialog>
      )}
    </>
  );
}
