"use client";
import type { ReactNode } from "react";

export interface EditableRow {
  key: string;
  /** One cell per column head but the last (the Remove button's). */
  cells: ReactNode[];
  /** What the Remove button says to a screen reader, e.g. "Remove shift 2". */
  removeLabel: string;
  onRemove: () => void;
}

/**
 * A card holding a table of editable rows (the calendar's shifts, closures and windows): its heading with an
 * Add button, a line saying what the rows mean, the column heads, and each row's cells with a Remove button.
 * Read-only viewers see neither button. `minWidthClass` is a whole Tailwind class written out by the caller
 * (e.g. "min-w-[640px]"), so that Tailwind finds it in the source; so are `headClasses`, one per column head
 * (widths: left to the browser, short number columns took as much room as a closure's name, which was cut off).
 */
export function EditableTable(props: {
  id: string;
  title: string;
  note: ReactNode;
  heads: string[];
  headClasses?: string[];
  minWidthClass: string;
  readOnly: boolean;
  addLabel: string;
  onAdd: () => void;
  addDisabled?: boolean;
  rows: EditableRow[];
}) {
  const { id, title, note, heads, headClasses, minWidthClass, readOnly, addLabel, onAdd, addDisabled, rows } = props;
  return (
    <section className="card scroll-x" aria-labelledby={id}>
      <div className="flex items-center justify-between gap-3">
        <h2 id={id}>{title}</h2>
        {!readOnly && (
          <button type="button" className="btn-secondary" disabled={addDisabled} onClick={onAdd}>
            {addLabel}
          </button>
        )}
      </div>
      <p className="mt-1 text-sm text-muted">{note}</p>
      <table className={`mt-3 w-full ${minWidthClass} border-collapse`}>
        <thead>
          <tr>
            {[...heads, ""].map((h, i) => (
              <th key={i} scope="col" className={`table-head ${headClasses?.[i] ?? ""}`}>
                {h || <span className="sr-only">Actions</span>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.key} className="align-top">
              {r.cells.map((c, i) => (
                <td key={i} className="table-cell">
                  {c}
                </td>
              ))}
              <td className="table-cell">
                {!readOnly && (
                  <button type="button" className="btn-danger" onClick={r.onRemove} aria-label={r.removeLabel}>
                    Remove
                  </button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
