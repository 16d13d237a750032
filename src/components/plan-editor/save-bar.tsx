"use client";
/** The sticky save bar: unsaved-changes state, change note, explicit Save, and who saved what last (with history). */
import { formatDateTime } from "@/lib/format";
import type { Revision, ScenarioRecord } from "@/lib/scenario-contract";
import { RevisionChanges } from "./revision-changes";

export function SaveBar({
  canEdit,
  dirty,
  saving,
  changeNote,
  onChangeNote,
  onSave,
  status,
  scenario,
  revisions,
}: {
  canEdit: boolean;
  dirty: boolean;
  saving: boolean;
  changeNote: string;
  onChangeNote: (v: string) => void;
  onSave: () => void;
  status: { bad: boolean; text: string } | null;
  scenario: ScenarioRecord;
  revisions: Revision[];
}) {
  const last = (
    <p className="text-xs text-muted" data-testid="last-saved">
      v{scenario.version} saved by {scenario.updatedByName}, {formatDateTime(scenario.updatedAt)}
      {scenario.changeNote ? ` — ${scenario.changeNote}` : ""}
    </p>
  );
  const history = revisions.length > 0 && (
    <details className="text-xs">
      <summary className="cursor-pointer text-brand-700">History ({revisions.length})</summary>
      <ol className="mt-1 max-h-72 space-y-0.5 overflow-auto">
        {revisions.slice(0, 20).map((r) => (
          <li key={r.version}>
            <span className="font-semibold">v{r.version}</span> {r.savedByName}, {formatDateTime(r.savedAt)}
            {r.changeNote ? ` — ${r.changeNote}` : ""}
            <RevisionChanges scenarioId={scenario.id} version={r.version} />
          </li>
        ))}
      </ol>
    </details>
  );

  if (!canEdit) {
    return (
      <div className="card space-y-1 py-3">
        {last}
        {history}
      </div>
    );
  }
  return (
    <div className="sticky bottom-0 z-20 -mx-1 rounded-lg border border-line bg-white/95 px-4 py-2 shadow-lg backdrop-blur sm:py-3" role="region" aria-label="Save changes">
      <div className="flex flex-wrap items-end gap-x-3 gap-y-2">
        <div className="w-full space-y-1 sm:w-auto sm:min-w-[12rem] sm:flex-1">
          <p aria-live="polite" className="text-sm">
            {dirty ? (
              <span className="badge bg-warn-bg text-warn" data-testid="unsaved-indicator">
                Unsaved changes
              </span>
            ) : (
              <span className="text-muted">No unsaved changes</span>
            )}
            {status && (
              <span className={`ml-2 ${status.bad ? "text-bad" : "text-ok"}`} role={status.bad ? "alert" : "status"} data-testid="save-status">
                {status.text}
              </span>
            )}
          </p>
          {/* On a phone the bar stays small (it covers the form it floats over): who saved last and the history
              wait for a wider screen; the change note's placeholder says what it is for. */}
          <div className="hidden space-y-1 sm:block">
            {last}
            {history}
          </div>
        </div>
        <div className="min-w-0 flex-1 sm:w-72 sm:flex-none">
          <label htmlFor="change-note" className="field-label max-sm:sr-only">
            Change note
          </label>
          <input
            id="change-note"
            data-testid="change-note"
            className="field-input"
            maxLength={300}
            placeholder="What changed and why"
            value={changeNote}
            onChange={(e) => onChangeNote(e.target.value)}
          />
        </div>
        <button type="button" className="btn-primary" data-testid="save-scenario" onClick={onSave} disabled={saving || !dirty}>
          {saving ? "Saving…" : "Save"}
        </button>
      </div>
    </div>
  );
}
