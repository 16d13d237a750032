"use client";
/**
 * The head and body of a TanStack table whose column headers sort it: each header is a button (keyboard
 * reachable), the state is announced through aria-sort, and the arrow is decoration only.
 */
import { flexRender, type Table } from "@tanstack/react-table";

/** `sortable={false}`: plain headers (a printed document has nothing to click). */
export function SortableHead<T>({ table, sortable = true }: { table: Table<T>; sortable?: boolean }) {
  return (
    <thead>
      {table.getHeaderGroups().map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) => {
            const sorted = h.column.getIsSorted();
            if (!sortable)
              return (
                <th key={h.id} scope="col" className="table-head">
                  {flexRender(h.column.columnDef.header, h.getContext())}
                </th>
              );
            return (
              <th key={h.id} scope="col" className="table-head" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}>
                <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink" onClick={h.column.getToggleSortingHandler()}>
                  {flexRender(h.column.columnDef.header, h.getContext())}
                  <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                </button>
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}

export function TableRows<T>({ table, cellClassName = "table-cell" }: { table: Table<T>; cellClassName?: string }) {
  return (
    <tbody>
      {table.getRowModel().rows.map((row) => (
        <tr key={row.id} className="hover:bg-paper">
          {row.getVisibleCells().map((cell) => (
            <td key={cell.id} className={cellClassName}>
              {flexRender(cell.column.columnDef.cell, cell.getContext())}
            </td>
          ))}
        </tr>
      ))}
    </tbody>
  );
}
