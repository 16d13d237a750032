"use client";
/**
 * A modal question before an action that reaches people outside the app or cannot be undone (publishing closure
 * notices, revoking a share link). It shows what will happen — the children — and acts only on the second,
 * explicit button; Escape and Cancel leave everything as it was.
 */
import { useEffect, useId, useRef, type ReactNode } from "react";

export function ConfirmDialog({
  title,
  children,
  confirmLabel,
  busyLabel = "Working…",
  busy = false,
  danger = false,
  error,
  onConfirm,
  onCancel,
  testId,
}: {
  title: string;
  children: ReactNode;
  confirmLabel: string;
  busyLabel?: string;
  busy?: boolean;
  danger?: boolean;
  error?: string | null;
  onConfirm: () => void;
  onCancel: () => void;
  testId?: string;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  return (
    <dialog
      ref={ref}
      data-testid={testId}
      aria-labelledby={`${id}-title`}
      className="m-auto w-[min(40rem,calc(100vw-2rem))] rounded-lg border border-line bg-white p-0 text-ink shadow-xl backdrop:bg-ink/40"
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onCancel();
      }}
    >
      <div className="p-5">
        <h2 id={`${id}-title`}>{title}</h2>
        <div className="mt-3 space-y-3 text-sm">{children}</div>
        {error && (
          <p role="alert" className="field-error mt-3">
            {error}
          </p>
        )}
        <div className="mt-5 flex flex-wrap justify-end gap-2">
          <button type="button" className="btn-secondary" onClick={onCancel} disabled={busy} autoFocus>
            Cancel
          </button>
          <button type="button" className={danger ? "btn-danger" : "btn-primary"} onClick={onConfirm} disabled={busy} data-testid={testId ? `${testId}-confirm` : undefined}>
            {busy ? busyLabel : confirmLabel}
          </button>
        </div>
      </div>
    </dialog>
  );
}
