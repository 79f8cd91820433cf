import { useMemo, useState } from "react";
import {
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
  type VisibilityState,
} from "@tanstack/react-table";
import type { AnalysisResponse } from "@shared/schemas/analysis";
import { Button } from "@/components/button";
import { Checkbox } from "@/components/field";
import { TableView } from "@/components/table-view";
import { METHOD_LABELS } from "../state/method-fields";
import { downloadText } from "@/lib/download";
import { formatPairCsvHeader, pairCsvHeader } from "../state/csv-header";
import { tableToCsv } from "./csv-download";
import { anyFlag, PAIR_COLUMNS } from "./pair-columns";

type PairTableProps = {
  analysis: AnalysisResponse;
  /** Which method of the analysis the table lists (index into analysis.methods). */
  methodIndex: number;
  /** The saved profile the analysis named, for the CSV header; null for a typed-in shape. */
  profile: string | null;
  flaggedOnly: boolean;
  onFlaggedOnly: (value: boolean) => void;
};

/** Every pair of one method: sort by any column, show only flagged pairs, hide columns, download what is shown. */
export function PairTable({ analysis, methodIndex, profile, flaggedOnly, onFlaggedOnly }: PairTableProps) {
  const method = analysis.methods[methodIndex];
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
  const download = () =>
    downloadText(
      formatPairCsvHeader(pairCsvHeader(analysis, methodIndex, profile, flaggedOnly)) + tableToCsv(table),
      `ropewalk-pairs-${methodIndex + 1}-${method.method}-${analysis.targetContext}.csv`,
    );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-4">
          <Checkbox
            label="Flagged pairs only"
            checked={flaggedOnly}
            onChange={(e) => onFlaggedOnly(e.target.checked)}
          />
          <details className="text-note">
            <summary className="cursor-pointer text-seaglass">Columns</summary>
            <div className="mt-1 flex flex-wrap gap-3">
              {table
                .getAllLeafColumns()
                .filter((c) => c.getCanHide())
                .map((c) => (
                  <Checkbox
                    key={c.id}
                    label={String(c.columnDef.header)}
                    checked={c.getIsVisible()}
                    onChange={c.getToggleVisibilityHandler()}
                  />
                ))}
            </div>
          </details>
        </div>
        <Button variant="secondary" size="sm" onClick={download}>
          Download CSV
        </Button>
      </div>
      <TableView
        table={table}
        caption={`Pairs of ${METHOD_LABELS[method.method]}`}
        emptyText="No pair carries a flag for this method."
        headerCase="as-written"
        maxHeight="max-h-[32rem]"
        dense
        rowAttributes={(row) => ({ "data-flagged": anyFlag(row.original) || undefined })}
      />
      <p className="text-note text-ink-soft" data-testid="pair-count">
        {rows.length} of {method.pairs.length} pairs shown. Values show 4 significant figures; the CSV holds full
        precision, after a commented header (# lines) naming the model, method, parameters and engine version.
      </p>
    </div>
  );
}
