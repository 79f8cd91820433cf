import type { ReactNode } from "react";
import { flexRender, type Row, type Table } from "@tanstack/react-table";

const SORT_MARK = { asc: "▲", desc: "▼" } as const;

type TableViewProps<T> = {
  /** A TanStack table the caller built (its sorting, filtering and column visibility are the caller's). */
  table: Table<T>;
  /** Accessible name of the table. */
  caption: string;
  emptyText: ReactNode;
  /** Small capitals suit lists; figures whose headers carry symbols (λ, θ′) keep them as written. */
  headerCase?: "upper" | "as-written";
  /** Tailwind max-height class: the table scrolls inside it and the header row stays in view. */
  maxHeight?: string;
  dense?: boolean;
  rowAttributes?: (row: Row<T>) => Record<string, string | boolean | undefined>;
};

/** The rendering of a data table: sortable headers (click to sort), rows, and a line when there are none. */
export function TableView<T>({
  table,
  caption,
  emptyText,
  headerCase = "upper",
  maxHeight,
  dense = false,
  rowAttributes,
}: TableViewProps<T>) {
  const rows = table.getRowModel().rows;
  const headerText = headerCase === "upper" ? "tracking-wide uppercase" : "whitespace-nowrap";
  return (
    <div className={`relative overflow-auto rounded-md border border-rule ${maxHeight ?? ""}`}>
      <table className="w-full border-collapse text-left text-body">
        <caption className="sr-only">{caption}</caption>
        <thead className={`bg-paper-deep ${maxHeight ? "sticky top-0" : ""}`}>
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
                    className={`border-b border-rule px-3 py-2 text-note font-semibold text-ink-soft ${headerText}`}
                  >
                    {header.isPlaceholder ? null : header.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className={`inline-flex items-center gap-1 hover:text-hemp-dark ${headerText}`}
                      >
                        {label}
                        <span aria-hidden className="text-[10px]">
                          {sorted ? SORT_MARK[sorted] : "↕"}
                        </span>
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
            <tr
              key={row.id}
              className="border-b border-rule/70 last:border-b-0 hover:bg-hemp-pale/40"
              {...rowAttributes?.(row)}
            >
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className={`px-3 ${dense ? "py-1.5 align-top" : "py-2 align-middle"}`}>
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {rows.length === 0 && (
            <tr>
              <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-center text-ink-soft">
                {emptyText}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
