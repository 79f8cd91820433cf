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
  /** The workspace currency prices are in (ISO code), once it has loaded. */
  currency?: string;
  busyId: number | null;
  onEdit: (a: Accelerator) => void;
  onDelete: (a: Accelerator) => void;
  /** The row whose Delete was pressed: it asks in place, beside the button, before anything is sent. */
  confirming?: { id: number; onConfirm: () => void; onCancel: () => void; busy: boolean } | null;
  /** Set for the retired list: its rows offer Restore instead of Edit and Delete. */
  onRestore?: (a: Accelerator) => void;
};

/** The catalog: what each accelerator offers a training run, in the units the budget sheet uses. */
export function AcceleratorsTable(props: Props) {
  const { accelerators, canEdit, currency, busyId, onEdit, onDelete, onRestore, confirming } = props;
  const columns = useMemo(
    () => [
      col.accessor("name", { header: "Name" }),
      col.accessor("memoryBytes", { header: "Memory (GiB)", cell: (c) => sig3(c.getValue() / GIB) }),
      col.accessor("peakFlops", { header: "Dense peak (TFLOP/s)", cell: (c) => sig3(c.getValue() / TFLOPS) }),
      col.accessor("pricePerHour", { header: "Price per hour", cell: (c) => formatMoney(c.getValue(), currency) }),
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
                ) : confirming?.id === row.original.id ? (
                  <div
                    role="alert"
                    aria-label={`Confirm deleting ${row.original.name}`}
                    className="flex max-w-64 flex-col gap-2 whitespace-normal"
                  >
                    <span className="text-note">
                      Delete {row.original.name}? If a plan was costed on it, it is retired instead and the plans keep
                      their figures.
                    </span>
                    <div className="flex flex-wrap gap-2">
                      <Button
                        size="sm"
                        variant="danger"
                        autoFocus
                        busy={confirming.busy}
                        onClick={confirming.onConfirm}
                        aria-label={`Delete ${row.original.name}`}
                      >
                        Delete it
                      </Button>
                      <Button size="sm" variant="secondary" onClick={confirming.onCancel}>
                        Keep it
                      </Button>
                    </div>
                  </div>
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
    [canEdit, currency, busyId, onEdit, onDelete, onRestore, confirming],
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
