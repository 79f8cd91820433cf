import { useState } from "react";
import {
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from "@tanstack/react-table";
import { TableView } from "./table-view";

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

/** Generic table: click a header to sort, type to filter across every text column. */
export function DataTable<T>({
  data,
  columns,
  caption,
  getRowId,
  initialSorting = [],
  emptyText = "Nothing here yet.",
  filterPlaceholder = "Type a name, e-mail or role",
}: DataTableProps<T>) {
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
      <TableView table={table} caption={caption} emptyText={filter ? `No rows match “${filter}”.` : emptyText} />
      <p className="text-note text-ink-soft">
        {rows.length} of {data.length} shown
      </p>
    </div>
  );
}
