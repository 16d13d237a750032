"use client";
import Link from "next/link";
import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { formatIsoClock, formatIsoDay } from "@/lib/format";
import { STATUS_MARKS, STATUS_WORDS, allClosedSentence, cellWhy } from "@/lib/look-ahead-notice";
import type { OperationCell } from "@sim/lookahead";
import type { LookAheadBoard } from "@/lib/look-ahead-contract";
import { CellDetail } from "./cell-detail";
import { useNarrowScreen } from "@/components/use-narrow-screen";

const TONE: Record<OperationCell["status"], string> = {
  go: "border-ok/40 bg-white text-ok",
  partial: "border-warn/40 bg-warn-bg text-warn",
  no: "border-bad/40 bg-bad-bg text-bad",
  unknown: "border-line bg-paper text-muted",
  closed: "border-line bg-paper text-muted",
};

function age(min: number | null): string {
  if (min === null) return "at a time not on record";
  if (min < 1) return "just now"; // "0 min ago" reads like a fault
  return min < 90 ? `${min} min ago` : min < 2880 ? `${Math.round(min / 60)} h ago` : `${Math.round(min / 1440)} days ago`;
}

type Row = { shiftId: string; shiftName: string; opId: string; opName: string };
type Key = { date: string; shiftId: string; opId: string };

/** One cell: what the weather lets this operation do that shift, pressed for the hour-by-hour reasons. */
function CellButton({ date, row, cell, isOpen, onToggle, wide }: { date: string; row: Row; cell: OperationCell; isOpen: boolean; onToggle: () => void; wide?: boolean }) {
  const why = cellWhy(cell);
  return (
    <button
      type="button"
      data-testid={`cell-${date}-${row.shiftId}-${row.opId}`}
      data-status={cell.status}
      aria-expanded={isOpen}
      aria-label={`${row.opName}, ${row.shiftName}, ${formatIsoDay(date, { long: true })}: ${STATUS_WORDS[cell.status]}${why ? ` — ${why}` : ""}. Show the reasons.`}
      onClick={onToggle}
      className={`w-full min-w-24 rounded border px-2 py-1 text-left ${TONE[cell.status]} ${isOpen ? "ring-2 ring-brand-600" : ""}`}
    >
      <span aria-hidden="true" className="mr-1 font-bold">{STATUS_MARKS[cell.status]}</span>
      <span className="font-medium">{STATUS_WORDS[cell.status]}</span>
      {/* In the grid a reason is cut to the cell; on a phone's day card the whole of it fits. */}
      {why && <span className={`block text-xs ${wide ? "" : "truncate"}`}>{why}</span>}
    </button>
  );
}

const LEGEND = "✓ may work · ◐ part of the shift · ✗ blocked by the weather · ? the forecast cannot tell · – closed (no work day, holiday, winter or no closure window)";

/**
 * The week ahead: one row per shift and weather-gated operation, one column per day — and on a phone, where seven
 * columns do not fit, one card per day with its shifts one under another and a cell's reasons opened under it.
 */
export function LookAheadBoardView({ scenarioId, locationHref }: { scenarioId: string; locationHref: string | null }) {
  const q = useQuery({ queryKey: ["scenarios", scenarioId, "look-ahead"], queryFn: () => api<LookAheadBoard>(`/api/scenarios/${scenarioId}/look-ahead`) });
  const [open, setOpen] = useState<Key | null>(null);
  const narrow = useNarrowScreen();
  if (q.isPending) return <p className="text-sm text-muted">Loading the week ahead…</p>;
  if (q.isError) return <p role="alert" className="text-sm text-bad">{q.error.message}</p>;
  const b = q.data;
  const rows: Row[] = [];
  for (const d of b.days)
    for (const s of d.shifts)
      for (const o of s.operations)
        if (!rows.some((r) => r.shiftId === s.shiftId && r.opId === o.operationId)) rows.push({ shiftId: s.shiftId, shiftName: s.name, opId: o.operationId, opName: o.name });
  const find = (date: string, shiftId: string, opId: string) => {
    const d = b.days.find((x) => x.date === date);
    const s = d?.shifts.find((x) => x.shiftId === shiftId);
    return s ? { day: d!, shift: s, cell: s.operations.find((o) => o.operationId === opId) ?? null } : null;
  };
  const isOpen = (date: string, r: Row) => open?.date === date && open.shiftId === r.shiftId && open.opId === r.opId;
  const toggle = (date: string, r: Row) => setOpen(isOpen(date, r) ? null : { date, shiftId: r.shiftId, opId: r.opId });
  const selected = open && find(open.date, open.shiftId, open.opId);
  const f = b.forecast;
  const allClosed = allClosedSentence(b.days, b.nextOpen);
  return (
    <section className="card space-y-4" aria-labelledby="board-heading" data-testid="look-ahead">
      <div>
        <h2 id="board-heading">Week ahead from {formatIsoDay(b.today, { long: true })}</h2>
        <p className="mt-1 text-sm text-muted">
          Which shifts of the operations with a weather gate may work, from the hourly weather forecast and this scenario&apos;s gates, shifts and closure
          windows; operations without one follow the calendar alone and are not shown. Open a cell for the hour-by-hour reasons. {b.rainRule}
        </p>
        {f.status === "fresh" && (
          <p className="mt-1 text-sm text-muted" data-testid="forecast-source">
            Forecast{f.place ? ` for ${f.place}` : ""} from {f.source}, fetched {age(f.ageMinutes)}; hours {f.firstHour && formatIsoClock(f.firstHour)} to {f.lastHour && formatIsoClock(f.lastHour)} ({b.timeZone}).
          </p>
        )}
        {f.message && (
          <p role="status" className="mt-2 rounded-md border border-warn/40 bg-warn-bg px-3 py-2 text-sm text-warn" data-testid="forecast-message">
            {f.message}
            {f.status === "noLocation" && locationHref && (
              <>
                {" "}
                <Link href={locationHref} className="font-medium underline">
                  Set the location
                </Link>
              </>
            )}
          </p>
        )}
      </div>
      {allClosed && (
        <p role="status" className="rounded-md border border-line bg-paper px-3 py-2 text-sm" data-testid="board-all-closed">
          {allClosed}
        </p>
      )}
      {rows.length === 0 ? (
        <p className="text-sm text-muted">No operation of this scenario has a weather gate, so the weather decides nothing here.</p>
      ) : narrow ? (
        <div>
          <ol className="space-y-3" data-testid="look-ahead-days" aria-label="Week ahead, day by day">
            {b.days.map((d) => (
              <li key={d.date} className="rounded-md border border-line p-3" data-testid="look-ahead-day">
                <h3 className="text-base">{formatIsoDay(d.date, { long: true })}</h3>
                <ul className="mt-2 space-y-2">
                  {rows.map((r) => {
                    const hit = find(d.date, r.shiftId, r.opId);
                    if (!hit?.cell) return null;
                    return (
                      <li key={`${r.shiftId}-${r.opId}`} className="space-y-1">
                        <p className="text-sm">
                          <span className="font-medium">{r.opName}</span> <span className="text-muted">· {r.shiftName}</span>
                        </p>
                        <CellButton date={d.date} row={r} cell={hit.cell} isOpen={isOpen(d.date, r)} onToggle={() => toggle(d.date, r)} wide />
                        {isOpen(d.date, r) && <CellDetail day={hit.day} shift={hit.shift} cell={hit.cell} onClose={() => setOpen(null)} />}
                      </li>
                    );
                  })}
                </ul>
              </li>
            ))}
          </ol>
          <p className="mt-2 text-xs text-muted">{LEGEND}</p>
        </div>
      ) : (
        <div className="scroll-x">
          <table className="w-full border-collapse text-sm" data-testid="look-ahead-grid">
            <caption className="sr-only">Week ahead: may each operation work each shift</caption>
            <thead>
              <tr>
                <th scope="col" className="table-head">Shift and operation</th>
                {b.days.map((d) => (
                  <th key={d.date} scope="col" className="table-head whitespace-nowrap">
                    {formatIsoDay(d.date, { year: false })}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={`${r.shiftId}-${r.opId}`}>
                  <th scope="row" className="table-cell text-left font-medium">
                    {r.opName}
                    <span className="block text-xs font-normal text-muted">{r.shiftName}</span>
                  </th>
                  {b.days.map((d) => {
                    const c = find(d.date, r.shiftId, r.opId)?.cell;
                    if (!c) return <td key={d.date} className="table-cell text-muted">—</td>;
                    return (
                      <td key={d.date} className="table-cell p-1 align-top">
                        <CellButton date={d.date} row={r} cell={c} isOpen={isOpen(d.date, r)} onToggle={() => toggle(d.date, r)} />
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2 text-xs text-muted">{LEGEND}</p>
        </div>
      )}
      {!narrow && selected?.cell && <CellDetail day={selected.day} shift={selected.shift} cell={selected.cell} onClose={() => setOpen(null)} />}
    </section>
  );
}
