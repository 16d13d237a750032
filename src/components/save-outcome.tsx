/**
 * What became of a one-button save, said where the button is: "Saved." in a polite live region (present from the
 * start, so a screen reader announces the change), or the server's words as an alert.
 */
export function SaveOutcome({ saved, error }: { saved: boolean; error: Error | null }) {
  return (
    <>
      <p aria-live="polite" className="text-sm text-ok">
        {saved ? "Saved." : ""}
      </p>
      {error && (
        <p role="alert" className="field-error w-full">
          {error.message}
        </p>
      )}
    </>
  );
}
