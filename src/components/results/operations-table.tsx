"use client";
/** Per-operation finish percentiles, sortable by any column (keyboard: the header buttons; state in aria-sort). */
import { useMemo, useState } from "react";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { SortableHead, TableRows } from "@/components/sortable-table";
import type { RunSummary } from "@sim/summary";
import { quantileText } from "./summary-text";

type Row = RunSummary["operations"][number] & { order: number };

const col = createColumnHelper<Row>();

const dateCell = (v: string) => (v === "unfinished" ? <span className="text-warn">not reached</span> : quantileText(v));

export function OperationsTable({ operations, sortable = true }: { operations: RunSummary["operations"]; sortable?: boolean }) {
  const data = useMemo(() => operations.map((o, i) => ({ ...o, order: i })), [operations]);
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo(
    () => [
      col.accessor("order", { header: "Order", cell: (c) => c.getValue() + 1 }),
      col.accessor("name", { header: "Operation", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      // ISO dates sort as text; "unfinished" sorts after every date.
      col.accessor((r) => r.finish.p50, { id: "p50", header: "P50 finish", cell: (c) => dateCell(c.getValue()) }),
      col.accessor((r) => r.finish.p80, { id: "p80", header: "P80 finish", cell: (c) => <span className="font-semibold">{dateCell(c.getValue())}</span> }),
      col.accessor((r) => r.finish.p90, { id: "p90", header: "P90 finish", cell: (c) => dateCell(c.getValue()) }),
    ],
    [],
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
    <div className="overflow-x-auto">
      <table className="w-full border-collapse" data-testid="operations-table">
        <caption className="sr-only">Finish percentiles per operation{sortable ? "; the column headers sort the table" : ""}.</caption>
        <SortableHead table={table} sortable={sortable} />
        <TableRows table={table} />
      </table>
    </div>
  );
}
