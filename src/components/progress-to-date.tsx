import { formatIsoDate } from "@/lib/format";
import { shareText, type OperationProgress } from "@/lib/progress-to-date";
import { againstPlanText, type AgainstPlan } from "@/lib/against-plan";
import { ScrollBox } from "./scroll-box";

const feet = (ft: number) => `${Math.round(ft).toLocaleString("en-US")} ft`;

function againstCell(a: AgainstPlan | undefined, toDate: string, doneFt: number) {
  return a ? againstPlanText(a, toDate, doneFt, formatIsoDate) : "—";
}

/**
 * Each crew operation's feet done of the feet it has to do (src/lib/progress-to-date.ts), with a bar, per stage
 * when the plan has several, and its shifts, hours lost and first and last shift — how far the job has got, read
 * off the field log without a chart. `document`: the owner brief's narrower page, where nothing scrolls — no bar
 * and no first-shift column. `against`: each operation against the plan run's median iteration (src/lib/against-plan.ts).
 */
export function ProgressToDate({ rows, document = false, against }: { rows: OperationProgress[]; document?: boolean; against?: { byOperation: Map<string, AgainstPlan>; toDate: string; note: string } }) {
  const staged = rows.some((r) => r.stages.length > 1);
  // On a screen "Against the plan" is a column (the table scrolls in its box); on the narrower paper of a document,
  // and on a phone, where a wrapped column made every row a dozen lines tall off-screen, it is a line under its
  // operation's row (on a phone it stays in view while the table scrolls sideways).
  const column = against && !document;
  const line = against;
  const columns = document ? 6 : 7;
  return (
    <div>
      <ScrollBox label="Progress to date (scrolls sideways)">
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
              <th scope="col" className={column ? "py-2 pr-3" : "py-2"}>Last shift</th>
              {column && <th scope="col" className="hidden py-2 md:table-cell">Against the plan</th>}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const share = shareText(r.doneFt, r.totalFt);
              return [
                <tr key={r.id} className={`align-top ${document && line ? "" : column ? "border-b border-line/60 max-md:border-b-0" : "border-b border-line/60"}`} data-testid="progress-to-date-row">
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
                  <td className={`py-2 whitespace-nowrap ${column ? "pr-3" : ""}`}>{r.lastDate ? formatIsoDate(r.lastDate) : "—"}</td>
                  {column && <td className="hidden py-2 min-w-40 md:table-cell">{againstCell(against.byOperation.get(r.id), against.toDate, r.doneFt)}</td>}
                </tr>,
                line && (
                  <tr key={`${r.id}-against`} className={`border-b border-line/60 ${column ? "md:hidden" : ""}`} data-testid="progress-to-date-against">
                    <td colSpan={columns} className="pb-2 pl-3 text-xs">
                      <div className={column ? "sticky left-0 max-w-[calc(100vw-5rem)]" : ""}>
                        Against the plan: {againstCell(against.byOperation.get(r.id), against.toDate, r.doneFt)}
                      </div>
                    </td>
                  </tr>
                ),
              ];
            })}
          </tbody>
        </table>
      </ScrollBox>
      {against && <p className="mt-2 text-xs text-muted">{against.note}</p>}
    </div>
  );
}
