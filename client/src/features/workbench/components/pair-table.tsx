import { useMemo, useState } from "react";
import {
  flexRender, getCoreRowModel, getSortedRowModel, useReactTable,
  type SortingState, type VisibilityState,
} from "@tanstack/react-table";
import type { MethodResult } from "../../../../../shared/schemas/analysis";
import { Button } from "../../../components/button";
import { Checkbox } from "../../../components/field";
import { METHOD_LABELS } from "../state/method-fields";
import { downloadText, tableToCsv } from "./csv-download";
import { anyFlag, PAIR_COLUMNS } from "./pair-columns";

type PairTableProps = {
  method: MethodResult;
  methodNumber: number;
  targetContext: number;
  flaggedOnly: boolean;
  onFlaggedOnly: (value: boolean) => void;
};

const SORT_MARK = { asc: "▲", desc: "▼" } as const;

/** Every pair of one method: sort by any column, show only flagged pairs, hide columns, download what is shown. */
export function PairTable({ method, methodNumber, targetContext, flaggedOnly, onFlaggedOnly }: PairTableProps) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [visibility, setVisibility] = useState<VisibilityState>({ invFreq: false, scaledInvFreq: false });
  const data = useMemo(() => (flaggedOnly ? method.pairs.filter(anyFlag) : method.pairs), [method.pairs, flaggedOnly]);
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data,
    columns: PAIR_COLUMNS,
    getRowId: (p) => String(p.index),
    state: { sorting, columnVisibility: visibility },
    onSortingChange: setSorting,
    onColumnVisibilityChange: setVisibility,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const rows = table.getRowModel().rows;
  const download = () => downloadText(tableToCsv(table), `ropewalk-pairs-${methodNumber}-${method.method}-${targetContext}.csv`);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-4">
          <Checkbox label="Flagged pairs only" checked={flaggedOnly} onChange={(e) => onFlaggedOnly(e.target.checked)} />
          <details className="text-note">
            <summary className="cursor-pointer text-seaglass">Columns</summary>
            <div className="mt-1 flex flex-wrap gap-3">
              {table.getAllLeafColumns().filter((c) => c.getCanHide()).map((c) => (
                <Checkbox key={c.id} label={String(c.columnDef.header)} checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} />
              ))}
            </div>
          </details>
        </div>
        <Button variant="secondary" size="sm" onClick={download}>
          Download CSV
        </Button>
      </div>
      <div className="max-h-[32rem] overflow-auto rounded-md border border-rule">
        <table className="w-full border-collapse text-left text-body" aria-label={`Pairs of ${METHOD_LABELS[method.method]}`}>
          <thead className="sticky top-0 bg-paper-deep">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined} className="border-b border-rule px-3 py-2 text-note font-semibold text-ink-soft">
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 whitespace-nowrap hover:text-hemp-dark">
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden className="text-[10px]">{sorted ? SORT_MARK[sorted] : "↕"}</span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-rule/70 last:border-b-0 hover:bg-hemp-pale/40" data-flagged={anyFlag(row.original) || undefined}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-1.5 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-center text-ink-soft">
                  No pair carries a flag for this method.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <p className="text-note text-ink-soft" data-testid="pair-count">
        {rows.length} of {method.pairs.length} pairs shown. Values show 4 significant figures; the CSV holds full precision.
      </p>
    </div>
  );
}
