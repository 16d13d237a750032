"use client";
import { useEffect, useRef } from "react";

export interface PublicationPreview {
  runId: string;
  closureCount: number;
  recipients: string[];
  subject: string;
  text: string;
}

/**
 * Publishing e-mails people outside the project, so nothing goes until the user has seen exactly what will be
 * sent and to whom, and said yes. Escape or Cancel closes it with nothing sent.
 */
export function PublishPreviewDialog({ preview, busy, error, onConfirm, onCancel }: { preview: PublicationPreview; busy: boolean; error: string | null; onConfirm: () => void; onCancel: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  const n = preview.recipients.length;
  return (
    <dialog
      ref={ref}
      data-testid="publish-preview"
      aria-labelledby="publish-preview-heading"
      aria-describedby="publish-preview-summary"
      className="m-auto w-[min(48rem,calc(100vw-2rem))] rounded-lg border border-line bg-white p-0 text-ink shadow-xl backdrop:bg-ink/40"
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onCancel();
      }}
    >
      <div className="p-5">
        <h2 id="publish-preview-heading">Check the notice before it is sent</h2>
        <p id="publish-preview-summary" className="mt-1 text-sm">
          {preview.closureCount} closure period{preview.closureCount === 1 ? "" : "s"} go into a public calendar feed and travel advisory.{" "}
          {n === 0 ? "Nobody is on the list, so no e-mail is sent." : `This notice goes to ${n} address${n === 1 ? "" : "es"}:`}
        </p>
        {n > 0 && (
          <ul className="mt-2 max-h-24 overflow-auto text-sm" data-testid="publish-recipients">
            {preview.recipients.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        )}
        <h3 className="mt-4">Subject: {preview.subject}</h3>
        <pre tabIndex={0} aria-label="The notice as it will be sent" className="mt-2 max-h-72 overflow-auto whitespace-pre-wrap rounded-md border border-line bg-paper p-3 text-xs" data-testid="publish-text">
          {preview.text}
        </pre>
        {error && (
          <p role="alert" className="field-error">
            {error}
          </p>
        )}
        <div className="mt-4 flex flex-wrap justify-end gap-2">
          <button type="button" className="btn-secondary" onClick={onCancel} disabled={busy}>
            Cancel — send nothing
          </button>
          <button type="button" className="btn-primary" onClick={onConfirm} disabled={busy} data-testid="confirm-publish">
            {busy ? "Publishing…" : n > 0 ? `Publish and send to ${n}` : "Publish"}
          </button>
        </div>
      </div>
    </dialog>
  );
}
