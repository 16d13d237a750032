"use client";
/**
 * The plans of a search, as the signed-in page and a search's share link both show them: the frontier chart
 * and a sortable, filterable table. `onSave`, when given, adds the "Save as scenario" button to each finished
 * variant (the signed-in page, for those who may edit), and `onAdopt` the "Use in this plan" button (while the
 * plan is still the version searched); a shared search has neither.
 */
import { useMemo, useState } from "react";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { RowCards, SortableHead, TableRows } from "@/components/sortable-table";
import { useNarrowScreen } from "@/components/use-narrow-screen";
import { formatIsoDate, formatPercent } from "@/lib/format";
import { FrontierChart } from "./frontier-chart";
import type { VariantRow } from "@/lib/search-contract";
import { filterRows } from "./search-logic";

const col = createColumnHelper<VariantRow>();
const finishKey = (r: VariantRow) => (r.outcome ? (r.outcome.p80Finish === "unfinished" ? "9999" : r.outcome.p80Finish) : "");

export function SearchPlans({ variants, targetDate, onSave, onAdopt, saving = false }: { variants: VariantRow[]; targetDate: string | null; onSave?: (row: VariantRow) => void; onAdopt?: (row: VariantRow) => void; saving?: boolean }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "p80", desc: false }]);
  const [byTarget, setByTarget] = useState(false);
  const [frontierOnly, setFrontierOnly] = useState(false);
  const rows = useMemo(() => filterRows(variants, { p80By: byTarget ? targetDate : null, frontierOnly }), [variants, byTarget, frontierOnly, targetDate]);
  const columns = useMemo(
    () => [
      // Sorted by the name the reader sees: the plan as saved has a label of its own.
      col.accessor((r) => (r.current ? "The plan as saved" : r.label), {
        id: "label",
        header: "Plan",
        // "text" compares without case; the automatic choice reads rows past the tenth and falls back to a
        // case-sensitive compare on a short table ("The plan as saved" before "stand down …").
        sortingFn: "text",
        meta: { sortWords: ["A to Z", "Z to A"] },
        cell: (c) => (
          <span>
            {c.row.original.current ? <strong>{c.getValue()}</strong> : c.getValue()}
            {c.row.original.onFrontier && <span className="badge ml-2 bg-brand-50 text-brand-800">Frontier</span>}
          </span>
        ),
      }),
      col.accessor(finishKey, { id: "p80", header: "P80 finish", meta: { sortWords: ["earliest first", "latest first"] }, cell: (c) => (c.row.original.outcome ? formatIsoDate(c.row.original.outcome.p80Finish === "unfinished" ? null : c.row.original.outcome.p80Finish) || "unfinished" : statusText(c.row.original)) }),
      col.accessor((r) => r.outcome?.targetProbability ?? -1, { id: "target", header: "Meets target", cell: (c) => (c.getValue() < 0 ? "—" : formatPercent(c.getValue())) }),
      col.accessor((r) => r.outcome?.delayVehHours ?? -1, { id: "delay", header: "Delay (veh-h)", cell: (c) => (c.getValue() < 0 ? "—" : Math.round(c.getValue()).toLocaleString("en-US")) }),
      col.accessor((r) => r.outcome?.contractCost ?? -1, { id: "cost", header: "Contract cost", cell: (c) => (c.getValue() < 0 ? "—" : `$${Math.round(c.getValue()).toLocaleString("en-US")}`) }),
      ...(onSave
        ? [
            col.display({
              id: "save",
              header: () => <span className="sr-only">Save</span>,
              cell: (c) =>
                !c.row.original.current && c.row.original.status === "done" ? (
                  <span className="flex flex-wrap gap-2">
                    <button type="button" className="btn-secondary" disabled={saving} onClick={() => onSave(c.row.original)} data-testid="save-variant">
                      Save as scenario
                    </button>
                    {onAdopt && c.row.original.changesPlan && (
                      <button type="button" className="btn-secondary" disabled={saving} onClick={() => onAdopt(c.row.original)} data-testid="adopt-variant">
                        Use in this plan
                      </button>
                    )}
                  </span>
                ) : null,
            }),
          ]
        : []),
    ],
    [onSave, onAdopt, saving],
  );
  const narrow = useNarrowScreen();
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });

  return (
    <>
      <section className="card">
        <h2>Finish, delay and cost</h2>
        <FrontierChart rows={variants} />
      </section>
      <section className="card">
        <div className="flex flex-wrap items-center gap-4">
          <h2 className="mr-auto">Plans</h2>
          {targetDate && (
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={byTarget} onChange={(e) => setByTarget(e.target.checked)} /> Finish by the target ({formatIsoDate(targetDate)}) at P80
            </label>
          )}
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={frontierOnly} onChange={(e) => setFrontierOnly(e.target.checked)} /> Frontier only
          </label>
        </div>
        {narrow ? (
          <div className="mt-3" data-testid="search-table">
            <RowCards table={table} label="Plans" />
          </div>
        ) : (
          <div className="mt-3 scroll-x">
            <table className="w-full text-sm" data-testid="search-table">
              <SortableHead table={table} />
              <TableRows table={table} />
            </table>
          </div>
        )}
      </section>
    </>
  );
}

function statusText(r: VariantRow) {
  if (r.status === "pending") return "running…";
  if (r.status === "infeasible") return `not a valid plan: ${r.problem ?? ""}`;
  return `failed: ${r.problem ?? ""}`;
}
