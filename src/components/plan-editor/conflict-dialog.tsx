"use client";
/**
 * Shown when a save met a newer version (409). Lists what differs between their version and these edits and
 * lets the user choose: keep theirs, save these edits over theirs as a new version, or go back to editing.
 * Nothing is overwritten without the explicit second button.
 */
import { useEffect, useMemo, useRef } from "react";
import { formatDateTime } from "@/lib/format";
import { diffDefinitions, toFormValues } from "./plan-logic";
import { DifferenceList } from "./difference-list";
import type { ScenarioRecord } from "@/lib/scenario-contract";

export function ConflictDialog({
  theirs,
  mine,
  loadedVersion,
  busy,
  onKeepTheirs,
  onSaveMine,
  onCancel,
}: {
  theirs: ScenarioRecord;
  mine: unknown;
  loadedVersion: number;
  busy: boolean;
  onKeepTheirs: () => void;
  onSaveMine: () => void;
  onCancel: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  const diffs = useMemo(() => {
    const theirDef = { ...(toFormValues(theirs.definition) as object), name: theirs.name, description: theirs.description };
    return diffDefinitions(theirDef, toFormValues(mine));
  }, [theirs, mine]);

  return (
    <dialog
      ref={ref}
      data-testid="conflict-dialog"
      aria-labelledby="conflict-heading"
      aria-describedby="conflict-summary"
      className="m-auto w-[min(48rem,calc(100vw-2rem))] rounded-lg border border-line bg-white p-0 text-ink shadow-xl backdrop:bg-ink/40"
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onCancel();
      }}
    >
      <div className="p-5">
        <h2 id="conflict-heading">Someone saved this plan while you were editing</h2>
        <p id="conflict-summary" className="mt-1 text-sm">
          Nothing was overwritten. Choose which version to keep.
        </p>
        <div className="mt-4 grid gap-3 sm:grid-cols-2">
          <div className="rounded-md border border-line bg-paper p-3 text-sm">
            <p className="font-semibold">Theirs: version {theirs.version}</p>
            <p className="mt-1">
              Saved by {theirs.updatedByName}, {formatDateTime(theirs.updatedAt)}
            </p>
            <p className="mt-1 text-muted">{theirs.changeNote ? `“${theirs.changeNote}”` : "No change note."}</p>
          </div>
          <div className="rounded-md border border-brand-100 bg-brand-50 p-3 text-sm">
            <p className="font-semibold">Yours: unsaved edits</p>
            <p className="mt-1">Made on version {loadedVersion}, which is no longer the latest.</p>
          </div>
        </div>
        <h3 className="mt-4">
          {diffs.length === 0 ? "Your edits and theirs define the same plan." : `${diffs.length} difference${diffs.length === 1 ? "" : "s"} (theirs → yours)`}
        </h3>
        {diffs.length > 0 && <DifferenceList diffs={diffs} values={mine} testId="conflict-diff" />}
        <div className="mt-5 flex flex-wrap justify-end gap-2">
          <button type="button" className="btn-secondary" onClick={onCancel} disabled={busy} autoFocus>
            Cancel, keep editing
          </button>
          <button type="button" className="btn-danger" onClick={onKeepTheirs} disabled={busy} data-testid="conflict-keep-theirs">
            Keep theirs (discard my edits)
          </button>
          <button type="button" className="btn-primary" onClick={onSaveMine} disabled={busy} data-testid="conflict-save-mine">
            {busy ? "Saving…" : `Save mine as version ${theirs.version + 1}`}
          </button>
        </div>
      </div>
    </dialog>
  );
}
