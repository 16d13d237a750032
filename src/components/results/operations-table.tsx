"use client";
/**
 * Finish percentiles by stage and operation, sortable by any column (keyboard: the header buttons; state in
 * aria-sort). With several stages, each stage's restoration (its lanes reopened) comes first, then each
 * operation's last packet over every stage; a one-stage plan lists operations only.
 */
import { useMemo, useState } from "react";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { SortableHead, TableRows } from "@/components/sortable-table";
import type { RunSummary } from "@sim/summary";
import { stageLabel } from "@/lib/stage-text";
import { quantileText } from "./summary-text";
import { ScrollBox } from "@/components/scroll-box";

type Row = { order: number; stage: string; name: string; finish: RunSummary["operations"][number]["finish"] };

const col = createColumnHelper<Row>();

const dateCell = (v: string) => (v === "unfinished" ? <span className="text-warn">not reached</span> : quantileText(v));

export function OperationsTable({ operations, stages = [], sortable = true }: { operations: RunSummary["operations"]; stages?: RunSummary["stages"]; sortable?: boolean }) {
  const staged = stages.length > 1;
  const data = useMemo(() => {
    const stageRows = staged ? stages.map((st, i) => ({ stage: stageLabel(st.name, i), name: `Lanes ${st.lanes.join(", ")} restored`, finish: st.finish })) : [];
    const opRows = operations.map((o) => ({ stage: staged ? "All stages (last packet)" : "", name: o.name, finish: o.finish }));
    return [...stageRows, ...opRows].map((r, order) => ({ ...r, order }));
  }, [operations, stages, staged]);
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo(
    () => [
      col.accessor("order", { header: "Order", cell: (c) => c.getValue() + 1 }),
      ...(staged ? [col.accessor("stage", { header: "Stage", cell: (c) => c.getValue() })] : []),
      col.accessor("name", { header: staged ? "Finished" : "Operation", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      // ISO dates sort as text; "unfinished" sorts after every date.
      col.accessor((r) => r.finish.p50, { id: "p50", header: "P50 finish", cell: (c) => dateCell(c.getValue()) }),
      col.accessor((r) => r.finish.p80, { id: "p80", header: "P80 finish", cell: (c) => <span className="font-semibold">{dateCell(c.getValue())}</span> }),
      col.accessor((r) => r.finish.p90, { id: "p90", header: "P90 finish", cell: (c) => dateCell(c.getValue()) }),
    ],
    [staged],
  );
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <ScrollBox label="Finish by operation (scrolls sideways)">
      <table className="w-full border-collapse" data-testid="operations-table">
        <caption className="sr-only">Finish percentiles {staged ? "per stage and per operation" : "per operation"}{sortable ? "; the column headers sort the table" : ""}.</caption>
        <SortableHead table={table} sortable={sortable} />
        <TableRows table={table} />
      </table>
    </ScrollBox>
  );
}
