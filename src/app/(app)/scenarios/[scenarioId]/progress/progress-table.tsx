"use client";
/** The recorded shifts: edit in place (the same form), delete, and each entry's history of who changed what. */
import { useRouter } from "next/navigation";
import { Fragment, useEffect, useState } from "react";
import { api, ApiError } from "@/lib/api-client";
import { formatDateTime, formatIsoDate, formatStation } from "@/lib/format";
import { DISCOVERED_LABELS } from "@/lib/progress-schema";
import { ProgressForm, type PlanFacts } from "./progress-form";
import { ShiftCells, ShiftHeads, WeatherAndLostCells } from "./shift-columns";
import type { ProgressEntry } from "@/lib/progress-schema";
import type { ProgressEntryAnswer, ProgressHistoryRow } from "@/lib/progress-contract";

/** A shift as the table shows it: the progress-entry contract's fields, plus who recorded it and its version. */
export interface EntryView extends ProgressEntry {
  id: string;
  version: number;
  enteredByName: string;
}

const FIELD_LABELS: Record<string, string> = {
  workDate: "work date", shift: "shift", operationId: "operation", fromStationFt: "from station", toStationFt: "to station", crew: "crew",
  tempF: "temperature", rain: "rain", lostHours: "lost hours", lostReason: "reason", discovered: "discovered conditions",
};

function changes(h: ProgressHistoryRow): string {
  if (h.action === "create") return "created the entry";
  if (h.action === "delete") return "deleted the entry";
  if (h.action === "restore") return "put the deleted entry back";
  const after = h.after;
  if (!h.before || !after) return "changed the entry";
  const diff = Object.keys(FIELD_LABELS).filter((k) => JSON.stringify(h.before![k]) !== JSON.stringify(after[k]));
  if (diff.length === 0) return "saved without changes";
  const show = (v: unknown) => (Array.isArray(v) ? `${v.length} item${v.length === 1 ? "" : "s"}` : v === null || v === "" ? "—" : String(v));
  return diff.map((k) => `${FIELD_LABELS[k]} ${show(h.before![k])} → ${show(after[k])}`).join("; ");
}

function History({ entryId }: { entryId: string }) {
  const [rows, setRows] = useState<ProgressHistoryRow[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    api<ProgressEntryAnswer>(`/api/progress/${entryId}`).then(
      (r) => live && setRows(r.history),
      (e: Error) => live && setError(e.message),
    );
    return () => {
      live = false;
    };
  }, [entryId]);
  if (error) return <p className="text-sm text-bad">{error}</p>;
  if (!rows) return <p className="text-sm text-muted">Loading history…</p>;
  return (
    <ol className="space-y-1 text-sm" data-testid="progress-history">
      {rows.map((h) => (
        <li key={h.id}>
          <span className="text-muted">{formatDateTime(h.changedAt)}</span> — {h.changedByName} {changes(h)}
        </li>
      ))}
    </ol>
  );
}

const PAGE = 30;

export function ProgressTable({ scenarioId, entries, facts, canRecord, names }: { scenarioId: string; entries: EntryView[]; facts: PlanFacts; canRecord: boolean; names: Record<string, string> }) {
  const router = useRouter();
  const [open, setOpen] = useState<{ id: string; mode: "edit" | "history" } | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  // A season's log runs to hundreds of shifts: the latest come first, the rest on request.
  const [showAll, setShowAll] = useState(false);
  // One operation's shifts only: finding last week's hydrodemolition entry among 300 shifts of seven crews.
  const [only, setOnly] = useState("");
  const present = new Set(entries.map((e) => e.operationId));
  // The plan's order (`names` is built from it), then any operation the plan no longer has.
  const operations = [...Object.keys(names).filter((id) => present.has(id)), ...[...present].filter((id) => !(id in names))];
  const picked = only ? entries.filter((e) => e.operationId === only) : entries;
  const newestFirst = [...picked].reverse();
  const shown = showAll ? newestFirst : newestFirst.slice(0, PAGE);
  const shiftName = (id: string) => facts.shifts.find((s) => s.id === id)?.name ?? id;

  async function remove(e: EntryView) {
    setProblem(null);
    const what = `the ${names[e.operationId] ?? e.operationId} entry of ${formatIsoDate(e.workDate)}`;
    if (!window.confirm(`Delete ${what}? It stays on record under "Deleted shifts", and a forecast that used it will be flagged as behind the field.`)) return;
    try {
      await api(`/api/progress/${e.id}?version=${e.version}`, { method: "DELETE" });
      router.refresh();
    } catch (err) {
      setProblem(err instanceof ApiError && err.fields.length ? `${err.message} ${err.fields.map((f) => f.message).join(". ")}` : (err as Error).message);
      // Corrected by someone else meanwhile: show their version, so the choice to delete is made on what stands.
      if (err instanceof ApiError && err.status === 409) router.refresh();
    }
  }

  if (entries.length === 0) {
    return (
      <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted" data-testid="progress-table">
        No shifts recorded yet.
      </p>
    );
  }
  return (
    <div>
      {problem && (
        <p role="alert" className="mb-2 text-sm text-bad">
          {problem}
        </p>
      )}
      {operations.length > 1 && (
        <div className="mb-2 flex items-center gap-2 text-sm">
          <label htmlFor="log-operation">Show</label>
          <select id="log-operation" className="field-input mt-0 w-auto" value={only} onChange={(e) => setOnly(e.target.value)}>
            <option value="">Every operation</option>
            {operations.map((id) => (
              <option key={id} value={id}>
                {names[id] ?? id}
              </option>
            ))}
          </select>
        </div>
      )}
      <div className="scroll-x">
        <table className="stack-on-phone w-full text-sm" data-testid="progress-table">
          <caption className="sr-only">Recorded shifts, newest first</caption>
          <thead>
            <tr className="border-b border-line text-left">
              <ShiftHeads />
              <th scope="col" className="py-2 pr-3">Weather</th>
              <th scope="col" className="py-2 pr-3">Lost</th>
              <th scope="col" className="py-2 pr-3">Discovered</th>
              <th scope="col" className="py-2 pr-3">Recorded by</th>
              <th scope="col" className="py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {shown.map((e) => (
              <Fragment key={e.id}>
                <tr className="border-b border-line/60 align-top" data-testid="progress-row">
                  <ShiftCells e={e} shiftName={shiftName} names={names} dayHref={(day) => `/scenarios/${scenarioId}/progress/daily?date=${day}`} />
                  <WeatherAndLostCells e={e} />
                  <td className="py-2 pr-3" data-label="Discovered" data-empty={e.discovered.length === 0 ? true : undefined}>
                    {e.discovered.length === 0
                      ? "—"
                      : e.discovered.map((d, i) => (
                          <div key={i}>
                            {DISCOVERED_LABELS[d.kind as keyof typeof DISCOVERED_LABELS] ?? d.kind}, {formatStation(d.fromStationFt)}–{formatStation(d.toStationFt)}, {d.areaSqFt} ft²
                          </div>
                        ))}
                  </td>
                  <td className="py-2 pr-3" data-label="Recorded by">
                    {e.enteredByName}
                  </td>
                  <td className="py-2 whitespace-nowrap" data-actions>
                    {canRecord && (
                      <button type="button" className="btn-secondary mr-1" onClick={() => setOpen(open?.id === e.id && open.mode === "edit" ? null : { id: e.id, mode: "edit" })}>
                        Edit
                      </button>
                    )}
                    <button type="button" className="btn-secondary mr-1" onClick={() => setOpen(open?.id === e.id && open.mode === "history" ? null : { id: e.id, mode: "history" })}>
                      History
                    </button>
                    {canRecord && (
                      <button type="button" className="btn-danger" onClick={() => remove(e)}>
                        Delete
                      </button>
                    )}
                  </td>
                </tr>
                {open?.id === e.id && (
                  <tr>
                    <td colSpan={10} className="bg-paper p-3">
                      {open.mode === "history" ? (
                        <History entryId={e.id} />
                      ) : (
                        <ProgressForm
                          scenarioId={scenarioId}
                          facts={facts}
                          entryId={e.id}
                          version={e.version}
                          initial={{ ...e, discovered: e.discovered as never }}
                          onDone={() => setOpen(null)}
                        />
                      )}
                    </td>
                  </tr>
                )}
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
      {picked.length > PAGE && (
        <p className="mt-3 text-sm">
          {showAll ? `All ${picked.length} shifts shown.` : `The latest ${PAGE} of ${picked.length} shifts.`}{" "}
          <button type="button" className="btn-secondary ml-2" onClick={() => setShowAll(!showAll)}>
            {showAll ? `Show the latest ${PAGE}` : `Show all ${picked.length}`}
          </button>
        </p>
      )}
    </div>
  );
}
