import { useMemo } from "react";
import { createColumnHelper } from "@tanstack/react-table";
import type { Accelerator } from "@shared/schemas/budget";
import { Button } from "@/components/button";
import { DataTable } from "@/components/data-table";
import { GIB, formatMoney, sig3, TFLOPS } from "@/lib/format";

const col = createColumnHelper<Accelerator>();

type Props = {
  accelerators: Accelerator[];
  canEdit: boolean;
  busyId: number | null;
  onEdit: (a: Accelerator) => void;
  onDelete: (a: Accelerator) => void;
  /** Set for the retired list: its rows offer Restore instead of Edit and Delete. */
  onRestore?: (a: Accelerator) => void;
};

/** The catalog: what each accelerator offers a training run, in the units the budget sheet uses. */
export function AcceleratorsTable({ accelerators, canEdit, busyId, onEdit, onDelete, onRestore }: Props) {
  const columns = useMemo(
    () => [
      col.accessor("name", { header: "Name" }),
      col.accessor("memoryBytes", { header: "Memory (GiB)", cell: (c) => sig3(c.getValue() / GIB) }),
      col.accessor("peakFlops", { header: "Dense peak (TFLOP/s)", cell: (c) => sig3(c.getValue() / TFLOPS) }),
      col.accessor("pricePerHour", { header: "Price per hour", cell: (c) => formatMoney(c.getValue()) }),
      col.accessor("notes", {
        header: "Notes",
        enableSorting: false,
        cell: (c) => <span className="text-note">{c.getValue()}</span>,
      }),
      ...(canEdit
        ? [
            col.display({
              id: "actions",
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }) =>
                onRestore ? (
                  <Button
                    size="sm"
                    variant="secondary"
                    busy={busyId === row.original.id}
                    onClick={() => onRestore(row.original)}
                    aria-label={`Restore ${row.original.name}`}
                  >
                    Restore
                  </Button>
                ) : (
                  <div className="flex gap-2">
                    <Button
                      size="sm"
                      variant="secondary"
                      onClick={() => onEdit(row.original)}
                      aria-label={`Edit ${row.original.name}`}
                    >
                      Edit
                    </Button>
                    <Button
                      size="sm"
                      variant="danger"
                      busy={busyId === row.original.id}
                      onClick={() => onDelete(row.original)}
                      aria-label={`Delete ${row.original.name}`}
                    >
                      Delete
                    </Button>
                  </div>
                ),
            }),
          ]
        : []),
    ],
    [canEdit, busyId, onEdit, onDelete, onRestore],
  );
  return (
    <DataTable
      data={accelerators}
      columns={columns}
      caption={onRestore ? "Retired from the catalog" : "Accelerators"}
      getRowId={(a) => String(a.id)}
      initialSorting={[{ id: "name", desc: false }]}
      emptyText="The catalog is empty."
      filterPlaceholder="Type a name or a note"
    />
  );
}
