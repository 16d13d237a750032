import { formatDateTime, formatIsoDate } from "@/lib/format";
import { RestoreButton } from "./restore-button";
import { ShiftCells, ShiftHeads } from "./shift-columns";
import { ScrollBox } from "@/components/scroll-box";

export interface DeletedShiftView {
  id: string;
  workDate: string;
  shift: string;
  operationId: string;
  fromStationFt: number;
  toStationFt: number;
  crew: string;
  enteredByName: string;
  deletedAt: Date | string | null;
  deletedByName: string | null;
}

/**
 * The shifts taken out of the log, kept on record: a field record does not vanish when someone deletes it, and the
 * project engineer can see who deleted what and when, and those who record shifts can put one back. Folded away:
 * most days there is nothing to look at.
 */
export function DeletedShifts(props: { rows: DeletedShiftView[]; shiftName: (id: string) => string; names: Record<string, string>; canRecord: boolean; csvHref: string }) {
  const { rows, shiftName, names, canRecord, csvHref } = props;
  if (rows.length === 0) return null;
  return (
    <details className="mt-4 text-sm" data-testid="deleted-shifts">
      <summary className="cursor-pointer">
        Deleted shifts ({rows.length.toLocaleString("en-US")}) — kept on record, not in any new forecast
      </summary>
      <ScrollBox label="Deleted shifts (scrolls sideways)" className="mt-2">
        <table className="stack-on-phone w-full">
          <caption className="sr-only">Deleted shifts, most recently deleted first</caption>
          <thead>
            <tr className="border-b border-line text-left">
              <ShiftHeads />
              <th scope="col" className="py-2 pr-3">Recorded by</th>
              <th scope="col" className="py-2 pr-3">Deleted</th>
              {canRecord && (
                <th scope="col" className="py-2">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-line/60 align-top text-muted" data-testid="deleted-shift">
                <ShiftCells e={r} shiftName={shiftName} names={names} />
                <td className="py-2 pr-3" data-label="Recorded by">
                  {r.enteredByName}
                </td>
                <td className="py-2 pr-3" data-label="Deleted">
                  {r.deletedByName ?? "—"}, {r.deletedAt ? formatDateTime(r.deletedAt) : "—"}
                </td>
                {canRecord && (
                  <td className="py-2" data-actions>
                    <RestoreButton entryId={r.id} what={`the ${names[r.operationId] ?? r.operationId} entry of ${formatIsoDate(r.workDate)}`} />
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollBox>
      {/* For an audit: every shift ever entered, each marked recorded or deleted — the plain download leaves these out. */}
      <a className="btn-secondary mt-2" href={csvHref} download data-testid="field-log-csv-with-deleted">
        Download the field log with deleted shifts (CSV)
      </a>
    </details>
  );
}
