import { Link } from "react-router-dom";
import { createColumnHelper } from "@tanstack/react-table";
import type { ReviewQueueItem } from "@shared/schemas/plans";
import { Button } from "@/components/button";
import { DataTable } from "@/components/data-table";
import { paths } from "@/config/paths";
import { formatDateTime, shortHash } from "@/lib/format";
import { ACTION_WORDS, passesText } from "@shared/review-words";

const column = createColumnHelper<ReviewQueueItem>();

/** Revisions waiting for the signed-in approver, oldest submission first. */
export function ReviewQueueTable({
  items,
  onDecide,
}: {
  items: ReviewQueueItem[];
  onDecide: (item: ReviewQueueItem) => void;
}) {
  const columns = [
    column.accessor("title", {
      header: "Plan",
      cell: ({ row: { original: i } }) => (
        <Link
          to={paths.plan(i.planId, i.revision)}
          className="font-medium text-ink underline decoration-rule-strong underline-offset-4 hover:text-hemp-dark"
        >
          {i.title}
        </Link>
      ),
    }),
    column.accessor("revision", { header: "Revision", cell: (c) => `r${c.getValue()}` }),
    column.accessor("author", { header: "Author" }),
    column.accessor("submittedAt", {
      header: "Sent",
      cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue())}</span>,
      enableGlobalFilter: false,
    }),
    column.accessor("contentHash", {
      header: "Content hash",
      cell: (c) => <code title={c.getValue()}>{shortHash(c.getValue())}</code>,
    }),
    column.accessor((i) => passesText(i.approvals, i.requiredApprovals), {
      id: "approvals",
      header: "Passes",
      enableGlobalFilter: false,
    }),
    column.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: i } }) => (
        <Button
          size="sm"
          onClick={() => onDecide(i)}
          aria-label={`${ACTION_WORDS.inspect} ${i.title} revision ${i.revision}`}
        >
          {ACTION_WORDS.inspect}
        </Button>
      ),
    }),
  ];
  return (
    <DataTable
      data={items}
      columns={columns}
      caption="Inspection bench"
      getRowId={(i) => `${i.planId}-${i.revision}`}
      filterPlaceholder="Type a plan title or author"
      emptyText="Nothing is on your bench. Revisions sent to inspection appear here until you pass them or send them back."
    />
  );
}
