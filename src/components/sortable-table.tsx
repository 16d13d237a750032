"use client";
/**
 * The head and body of a TanStack table whose column headers sort it: each header is a button (keyboard
 * reachable), the state is announced through aria-sort, and the arrow is decoration only.
 */
import { flexRender, type RowData, type Table } from "@tanstack/react-table";

declare module "@tanstack/react-table" {
  interface ColumnMeta<TData extends RowData, TValue> {
    /** How the phone's sort select words the two directions, e.g. ["earliest first", "latest first"]. */
    sortWords?: [ascending: string, descending: string];
  }
}

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

/**
 * The same rows as cards, for a phone: a table of five figures and a button does not fit 390 px, and a table
 * scrolled sideways hides the button a reader came for. The first column is each card's heading, the other data
 * columns a list of "heading: value", and display columns (buttons) sit at the card's foot. Sorting is a select.
 */
export function RowCards<T>({ table, label }: { table: Table<T>; label: string }) {
  return (
    <>
      <SortSelect table={table} />
      <ul className="mt-3 space-y-3" aria-label={label}>
        {table.getRowModel().rows.map((row) => {
          const [first, ...rest] = row.getVisibleCells();
          const figures = rest.filter((c) => c.column.accessorFn);
          const actions = rest.filter((c) => !c.column.accessorFn);
          return (
            <li key={row.id} className="rounded-md border border-line p-3 text-sm">
              <div>{first && flexRender(first.column.columnDef.cell, first.getContext())}</div>
              <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
                {figures.map((cell) => (
                  <div key={cell.id} className="contents">
                    <dt className="text-muted">{headerText(table, cell.column.id)}</dt>
                    <dd className="tabular-nums">{flexRender(cell.column.columnDef.cell, cell.getContext())}</dd>
                  </div>
                ))}
              </dl>
              {actions.map((cell) => (
                <div key={cell.id} className="mt-2">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </div>
              ))}
            </li>
          );
        })}
      </ul>
    </>
  );
}

/** A column's heading as words (the cards' labels and the sort select's options): string headers only. */
function headerText<T>(table: Table<T>, columnId: string): string {
  const header = table.getColumn(columnId)?.columnDef.header;
  return typeof header === "string" ? header : columnId;
}

/** Sort by one column, either way, from a select — what the clickable headers do in the table. */
function SortSelect<T>({ table }: { table: Table<T> }) {
  const sortable = table.getAllLeafColumns().filter((c) => c.getCanSort() && typeof c.columnDef.header === "string");
  const [current] = table.getState().sorting;
  const value = current ? `${current.id}:${current.desc ? "desc" : "asc"}` : "";
  return (
    <label className="flex flex-wrap items-center gap-2 text-sm">
      Sort by
      <select
        className="field-input mt-0 w-auto"
        value={value}
        onChange={(e) => {
          const [id, dir] = e.target.value.split(":");
          table.setSorting(id ? [{ id, desc: dir === "desc" }] : []);
        }}
      >
        {!current && <option value="">as listed</option>}
        {sortable.flatMap((c) => {
          const [up, down] = c.columnDef.meta?.sortWords ?? ["lowest first", "highest first"];
          return [
            <option key={`${c.id}:asc`} value={`${c.id}:asc`}>
              {headerText(table, c.id)}, {up}
            </option>,
            <option key={`${c.id}:desc`} value={`${c.id}:desc`}>
              {headerText(table, c.id)}, {down}
            </option>,
          ];
        })}
      </select>
    </label>
  );
}
