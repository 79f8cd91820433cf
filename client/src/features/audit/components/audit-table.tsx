import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import type { AuditEvent } from "@shared/schemas/audit";
import { Button } from "@/components/button";
import { TableView } from "@/components/table-view";
import { formatDateTime } from "@/lib/format";
import { AUDIT_ACTION_WORDS } from "@shared/review-words";

/** One line per detail key; hashes and long values wrap instead of widening the table. */
function Detail({ detail }: { detail: Record<string, unknown> }) {
  const entries = Object.entries(detail);
  if (entries.length === 0) return <span className="text-ink-soft">—</span>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-2 text-note">
      {entries.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="break-all">{typeof v === "object" ? JSON.stringify(v) : String(v)}</dd>
        </div>
      ))}
    </dl>
  );
}

type AuditTableProps = {
  events: AuditEvent[];
  onActor: (actorId: number) => void;
  onSubject: (type: string, id: string) => void;
  busy?: boolean;
};

const column = createColumnHelper<AuditEvent>();

/** The trail as the server paged it, newest first (no sorting here); a name or subject narrows the trail to it. */
export function AuditTable({ events, onActor, onSubject, busy = false }: AuditTableProps) {
  const columns = [
    column.accessor("at", {
      header: "When",
      cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue())}</span>,
    }),
    column.display({
      id: "actor",
      header: "Who",
      cell: ({ row: { original: e } }) =>
        e.actor ? (
          <Button
            variant="quiet"
            size="sm"
            className="justify-start text-left"
            onClick={() => onActor(e.actor!.id)}
            title="Only this person’s actions"
          >
            {e.actor.name}
          </Button>
        ) : (
          <span className="text-ink-soft">system</span>
        ),
    }),
    column.accessor("action", {
      header: "Action",
      // The recorded code stays visible (filters match it); workflow codes also get their words.
      cell: (c) => (
        <span className="flex flex-col">
          {AUDIT_ACTION_WORDS[c.getValue()] && <span className="text-body">{AUDIT_ACTION_WORDS[c.getValue()]}</span>}
          <span className="font-mono text-note" data-code>
            {c.getValue()}
          </span>
        </span>
      ),
    }),
    column.display({
      id: "subject",
      header: "Subject",
      cell: ({ row: { original: e } }) =>
        e.subjectId ? (
          <Button
            variant="quiet"
            size="sm"
            className="whitespace-nowrap"
            onClick={() => onSubject(e.subjectType, e.subjectId!)}
            title="Only this subject"
          >
            {e.subjectType} {e.subjectId}
          </Button>
        ) : (
          e.subjectType
        ),
    }),
    column.display({
      id: "detail",
      header: "Detail",
      cell: ({ row: { original: e } }) => <Detail detail={e.detail} />,
    }),
  ];
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data: events,
    columns,
    getRowId: (e) => String(e.id),
    getCoreRowModel: getCoreRowModel(),
    enableSorting: false,
  });
  return (
    <div aria-busy={busy || undefined} className={busy ? "opacity-70" : ""}>
      <TableView table={table} caption="Audit trail" emptyText="No events match these filters." dense />
    </div>
  );
}
