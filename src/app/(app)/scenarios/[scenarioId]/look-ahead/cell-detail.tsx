"use client";
import { formatIsoClock, formatIsoDay } from "@/lib/format";
import { STATUS_WORDS, hourRanges } from "@/lib/look-ahead-notice";
import { GATE_LABELS } from "@sim/lookahead-gates";
import type { LookAheadDay, LookAheadShift, OperationCell } from "@sim/lookahead";
import { ScrollBox } from "@/components/scroll-box";

const fmt = (v: number | null, unit: string) => (v === null ? "—" : `${Math.round(v)}${unit}`);
const hhmm = (iso: string) => formatIsoClock(iso, { year: false });

/** One cell's hour-by-hour reasons: the closure window, each hour's weather and gate verdicts, and for a pour every start tried. */
export function CellDetail({ day, shift, cell, onClose }: { day: LookAheadDay; shift: LookAheadShift; cell: OperationCell; onClose: () => void }) {
  return (
    <section aria-labelledby="cell-detail-heading" className="rounded-md border border-line p-4" data-testid="cell-detail">
      <div className="flex items-start justify-between gap-3">
        <div>
          <h3 id="cell-detail-heading">
            {cell.name}, {shift.name}, {formatIsoDay(day.date, { long: true })}: {STATUS_WORDS[cell.status]}
          </h3>
          <p className="mt-1 text-sm text-muted">
            Shift {hhmm(shift.start)} – {hhmm(shift.end)}.{" "}
            {cell.closure ? (cell.closure.open ? `${cell.closure.name}: ${cell.closure.windows.map((w) => `${hhmm(w.from)} – ${hhmm(w.to)}`).join(", ")}.` : `${cell.closure.name}: no window this shift.`) : ""}{" "}
            {cell.openHours > 0 && `${cell.openHours} h open, ${cell.workableHours} h workable${cell.pourHours ? ` (one pour takes ${cell.pourHours.toFixed(1)} h)` : ""}.`}
          </p>
        </div>
        <button type="button" className="btn-secondary" onClick={onClose}>
          Close
        </button>
      </div>
      {cell.closedReason && <p className="mt-2 text-sm">{cell.closedReason}</p>}
      {cell.failing.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-sm" data-testid="failing-gates">
          {cell.failing.map((f) => (
            <li key={f.gate}>
              <strong>{f.label}</strong> fails {hourRanges(f.at)}
            </li>
          ))}
        </ul>
      )}
      {cell.hours.length > 0 && (
        <ScrollBox label="Hour by hour (scrolls sideways)" className="mt-3">
          <table className="w-full border-collapse text-sm" data-testid="hour-reasons">
            <caption className="text-left text-sm font-medium">Hour by hour</caption>
            <thead>
              <tr>
                {["Hour", "Air", "Rain chance", "Humidity", "Wind", "Verdict", "Why"].map((h) => (
                  <th key={h} scope="col" className="table-head">{h}</th>
                ))}
              </tr>
            </thead>
            <tbody>
              {cell.hours.map((h) => (
                <tr key={h.start}>
                  <th scope="row" className="table-cell text-left font-normal">{hhmm(h.start)}</th>
                  <td className="table-cell">{fmt(h.tempF, " °F")}</td>
                  <td className="table-cell">{fmt(h.popPct, " %")}</td>
                  <td className="table-cell">{fmt(h.rhPct, " %")}</td>
                  <td className="table-cell">{fmt(h.windMph, " mph")}</td>
                  <td className="table-cell">{h.ok === true ? "✓ holds" : h.ok === false ? "✗ fails" : "? cannot tell"}</td>
                  <td className="table-cell">{h.problems.map((p) => `${GATE_LABELS[p.gate]}: ${p.detail}`).join("; ")}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
      {cell.pourStarts.length > 0 && (
        <div className="mt-3">
          <h4 className="text-sm font-medium">Pour starts tried</h4>
          <ul className="mt-1 text-sm" data-testid="pour-starts">
            {cell.pourStarts.map((p) => (
              <li key={p.start}>
                {p.ok === true ? "✓" : p.ok === false ? "✗" : "?"} {hhmm(p.start)} – {hhmm(p.finish)}
                {p.problems.length > 0 && `: ${p.problems.slice(0, 4).map((x) => `${GATE_LABELS[x.gate]} ${x.detail} at ${hhmm(x.at)}`).join("; ")}${p.problems.length > 4 ? ` and ${p.problems.length - 4} more` : ""}`}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
