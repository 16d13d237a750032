/**
 * The end of a form: a failure the fields cannot show (an alert), and the submit button with the status beside it,
 * spoken politely when it changes ("Saved.").
 */
export function FormFailure({ text }: { text: string | null }) {
  if (!text) return null;
  return (
    <p role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
      {text}
    </p>
  );
}

export function SubmitRow({ label, busyLabel, busy, status }: { label: string; busyLabel: string; busy: boolean; status: string }) {
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? busyLabel : label}
      </button>
      <p aria-live="polite" className="text-sm text-ok">
        {status}
      </p>
    </div>
  );
}
