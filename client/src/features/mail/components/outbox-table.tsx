import { createColumnHelper } from "@tanstack/react-table";
import type { OutboxRow } from "@shared/schemas/mail";
import { DataTable } from "@/components/data-table";
import { Chip } from "@/components/notice";
import { formatDateTime } from "@/lib/format";

const column = createColumnHelper<OutboxRow>();
const TONE = { sent: "seaglass", pending: "hemp" } as const;

const columns = [
  column.accessor("createdAt", {
    header: "Queued",
    cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue())}</span>,
    enableGlobalFilter: false,
  }),
  column.accessor("kind", { header: "Kind", cell: (c) => <code className="text-note">{c.getValue()}</code> }),
  column.accessor((r) => r.to.join(", "), { id: "to", header: "To" }),
  column.accessor("subject", { header: "Subject" }),
  column.accessor("status", {
    header: "Status",
    cell: (c) => <Chip tone={TONE[c.getValue() as keyof typeof TONE] ?? "muted"}>{c.getValue()}</Chip>,
  }),
  column.accessor("attempts", { header: "Attempts", enableGlobalFilter: false }),
  column.accessor((r) => r.lastError ?? "", {
    id: "lastError",
    header: "Last error",
    cell: (c) => <span className="text-note break-all text-signal-dark">{c.getValue()}</span>,
  }),
  column.accessor("sentAt", {
    header: "Sent",
    cell: (c) => (c.getValue() ? formatDateTime(c.getValue()!) : "—"),
    enableGlobalFilter: false,
  }),
];

/** Every queued message and where its delivery stands. */
export function OutboxTable({ rows }: { rows: OutboxRow[] }) {
  return (
    <DataTable
      data={rows}
      columns={columns}
      caption="Outbox"
      getRowId={(r) => String(r.id)}
      filterPlaceholder="Type a kind, recipient or subject"
      emptyText="The outbox is empty."
    />
  );
}
