import { useState } from "react";
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from "@tanstack/react-table";

type DataTableProps<T> = {
  data: T[];
  // Columns mix value types, so the value parameter stays open (TanStack's own examples do the same).
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  /** Accessible name of the table, also used in the filter label. */
  caption: string;
  getRowId?: (row: T) => string;
  initialSorting?: SortingState;
  emptyText?: string;
  /** Placeholder of the filter box; say what the text columns hold. */
  filterPlaceholder?: string;
};

const SORT_MARK = { asc: "▲", desc: "▼" } as const;

/** Generic table: click a header to sort, type to filter across every text column. */
export function DataTable<T>({ data, columns, caption, getRowId, initialSorting = [], emptyText = "Nothing here yet.", filterPlaceholder = "Type a name, e-mail or role" }: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [filter, setFilter] = useState("");
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data,
    columns,
    getRowId,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    globalFilterFn: "includesString",
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="flex flex-col gap-3">
      <label className="flex max-w-sm flex-col gap-1 text-note font-semibold text-ink">
        Filter {caption.toLowerCase()}
        <input
          type="search"
          value={filter}
          onChange={(e) => setFilter(e.target.value)}
          placeholder={filterPlaceholder}
          className="rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body font-normal focus:border-seaglass focus:outline-2 focus:outline-seaglass/30"
        />
      </label>
      <div className="overflow-x-auto rounded-md border border-rule">
        <table className="w-full border-collapse text-left text-body">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-paper-deep">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const label = flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                      className="border-b border-rule px-3 py-2 text-note font-semibold tracking-wide text-ink-soft uppercase"
                    >
                      {header.isPlaceholder ? null : header.column.getCanSort() ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-hemp-dark">
                          {label}
                          <span aria-hidden className="text-[10px]">{sorted ? SORT_MARK[sorted] : "↕"}</span>
                        </button>
                      ) : (
                        label
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-rule/70 last:border-b-0 hover:bg-hemp-pale/40">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-center text-ink-soft">
                  {filter ? `No rows match “${filter}”.` : emptyText}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <p className="text-note text-ink-soft">
        {rows.length} of {data.length} shown
      </p>
    </div>
  );
}
