import { Link } from "react-router-dom";
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { TableView } from "@/components/table-view";
import type { PlanListItem } from "@shared/schemas/plans";
import { paths } from "@/config/paths";
import { formatDate } from "@/lib/format";
import { ProofBadge } from "@/components/proof-badge";
import { StateBadge } from "./state-badge";

export type PlanSort = "updatedAt" | "createdAt" | "title" | "state" | "owner" | "model";

type PlansTableProps = {
  plans: PlanListItem[];
  total: number;
  sort: PlanSort;
  dir: "asc" | "desc";
  onSort: (sort: PlanSort, dir: "asc" | "desc") => void;
  busy?: boolean;
};

const column = createColumnHelper<PlanListItem>();

const columns = [
  column.accessor("title", {
    header: "Plan",
    cell: ({ row: { original: p } }) => (
      <span className="flex flex-col">
        <Link
          to={paths.plan(p.id)}
          className="font-medium text-ink underline decoration-rule-strong underline-offset-4 hover:text-hemp-dark"
        >
          {p.title}
        </Link>
        {p.purpose && <span className="line-clamp-1 text-note text-ink-soft">{p.purpose}</span>}
      </span>
    ),
  }),
  column.accessor("state", { header: "State", cell: (c) => <StateBadge state={c.getValue()} /> }),
  column.display({
    id: "proof",
    header: "Proof",
    // Only a plan with an approved revision can be proof-tested; the rest have nothing to show here.
    cell: ({ row: { original: p } }) =>
      p.approvedRevision === null ? <span className="text-ink-soft">—</span> : <ProofBadge proof={p.proof} />,
  }),
  column.accessor((p) => p.owner.name, { id: "owner", header: "Owner" }),
  column.accessor((p) => p.model.name, { id: "model", header: "Model" }),
  column.display({
    id: "revision",
    header: "Revision",
    cell: ({ row: { original: p } }) => (
      <span className="whitespace-nowrap text-note">
        r{p.latestRevision}
        {p.approvedRevision !== null && <span className="text-ink-soft"> · signed r{p.approvedRevision}</span>}
      </span>
    ),
  }),
  column.accessor("updatedAt", {
    header: "Updated",
    cell: (c) => <span className="whitespace-nowrap">{formatDate(c.getValue())}</span>,
  }),
  column.accessor("createdAt", {
    header: "Created",
    cell: (c) => <span className="whitespace-nowrap">{formatDate(c.getValue())}</span>,
  }),
];

/**
 * Plans as the server sorted and paged them: TanStack Table in manual mode, so a header click
 * asks the server for a new order instead of sorting the rows on this page.
 */
export function PlansTable({ plans, total, sort, dir, onSort, busy = false }: PlansTableProps) {
  const sorting: SortingState = [{ id: sort, desc: dir === "desc" }];
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data: plans,
    columns,
    getRowId: (p) => String(p.id),
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    enableSortingRemoval: false,
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      if (first) onSort(first.id as PlanSort, first.desc ? "desc" : "asc");
    },
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <div aria-busy={busy || undefined} className={busy ? "opacity-70" : ""}>
      <TableView table={table} caption="Plans" emptyText="No plans match these filters." />
    </div>
  );
}
