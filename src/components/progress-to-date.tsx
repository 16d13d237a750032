import { formatIsoDate } from "@/lib/format";
import { shareText, type OperationProgress } from "@/lib/progress-to-date";

const feet = (ft: number) => `${Math.round(ft).toLocaleString("en-US")} ft`;

/**
 * Each crew operation's feet done of the feet it has to do (src/lib/progress-to-date.ts), with a bar, per stage
 * when the plan has several, and its shifts, hours lost and first and last shift — how far the job has got, read
 * off the field log without a chart. `document`: the owner brief's narrower page, where nothing scrolls — no bar
 * and no first-shift column.
 */
export function ProgressToDate({ rows, document = false }: { rows: OperationProgress[]; document?: boolean }) {
  const staged = rows.some((r) => r.stages.length > 1);
  return (
    <div className="scroll-x">
      <table className="w-full text-sm" data-testid="progress-to-date">
        <caption className="sr-only">Progress to date by operation</caption>
        <thead>
          <tr className="border-b border-line text-left">
            <th scope="col" className="py-2 pr-3">Operation</th>
            <th scope="col" className="py-2 pr-3">Done</th>
            <th scope="col" className="py-2 pr-3">Share</th>
            <th scope="col" className="py-2 pr-3 text-right">Shifts</th>
            <th scope="col" className="py-2 pr-6 text-right">Hours lost</th>
            {!document && <th scope="col" className="py-2 pr-3">First shift</th>}
            <th scope="col" className="py-2">Last shift</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const share = shareText(r.doneFt, r.totalFt);
            return (
              <tr key={r.id} className="border-b border-line/60 align-top" data-testid="progress-to-date-row">
                <th scope="row" className="py-2 pr-3 text-left font-normal">{r.name}</th>
                <td className="py-2 pr-3">
                  <div className="whitespace-nowrap">
                    {feet(r.doneFt)} of {feet(r.totalFt)}
                  </div>
                  {/* A stage by its short name ("Stage 1" of "Stage 1: L1 behind barrier, …"): the line stays one line. */}
                  {staged && r.stages.length > 0 && (
                    <div className="text-xs text-muted">{r.stages.map((st) => `${st.stageName.split(":")[0]}: ${feet(st.doneFt)} of ${feet(st.totalFt)}`).join(" · ")}</div>
                  )}
                </td>
                <td className="py-2 pr-3">
                  <div className="flex items-center gap-2">
                    {/* The bar repeats the figure beside it, so it is hidden from screen readers. */}
                    {!document && (
                      <div className="h-2 w-24 overflow-hidden rounded bg-line" aria-hidden="true">
                        <div className="h-full bg-brand-600" style={{ width: `${r.totalFt > 0 ? Math.min(100, (100 * r.doneFt) / r.totalFt) : 0}%` }} />
                      </div>
                    )}
                    <span className="whitespace-nowrap">{share}</span>
                  </div>
                </td>
                <td className="py-2 pr-3 text-right">{r.shifts.toLocaleString("en-US")}</td>
                <td className="py-2 pr-6 text-right">{r.lostHours > 0 ? r.lostHours.toLocaleString("en-US", { maximumFractionDigits: 1 }) : "—"}</td>
                {!document && <td className="py-2 pr-3 whitespace-nowrap">{r.firstDate ? formatIsoDate(r.firstDate) : "—"}</td>}
                <td className="py-2 whitespace-nowrap">{r.lastDate ? formatIsoDate(r.lastDate) : "—"}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
