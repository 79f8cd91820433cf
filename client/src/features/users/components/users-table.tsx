import { createColumnHelper } from "@tanstack/react-table";
import type { User } from "@shared/schemas/users";
import { Button } from "@/components/button";
import { DataTable } from "@/components/data-table";
import { Chip } from "@/components/notice";
import { formatDate, roleLabel } from "@/lib/format";

type UsersTableProps = {
  users: User[];
  currentUserId: number;
  busyUserId: number | null;
  onEditRoles: (user: User) => void;
  onSetActive: (user: User, active: boolean) => void;
};

const column = createColumnHelper<User>();

export function UsersTable({ users, currentUserId, busyUserId, onEditRoles, onSetActive }: UsersTableProps) {
  const columns = [
    column.accessor("name", { header: "Name", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
    column.accessor("email", { header: "E-mail" }),
    // Filter and sort on the labels people read, render them as chips.
    column.accessor((u) => u.roles.map(roleLabel).join(", "), {
      id: "roles",
      header: "Roles",
      cell: (c) => (
        <span className="flex flex-wrap gap-1">
          {c.row.original.roles.map((r) => (
            <Chip key={r}>{roleLabel(r)}</Chip>
          ))}
        </span>
      ),
    }),
    column.accessor((u) => (u.active ? "Active" : "Deactivated"), {
      id: "status",
      header: "Status",
      cell: (c) => <Chip tone={c.row.original.active ? "seaglass" : "muted"}>{c.getValue()}</Chip>,
    }),
    column.accessor("createdAt", { header: "Added", cell: (c) => formatDate(c.getValue()), enableGlobalFilter: false }),
    column.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: user } }) => {
        const self = user.id === currentUserId;
        return (
          <span className="flex justify-end gap-2 whitespace-nowrap">
            <Button
              variant="secondary"
              size="sm"
              onClick={() => onEditRoles(user)}
              aria-label={`Change roles of ${user.name}`}
            >
              Change roles
            </Button>
            <Button
              variant={user.active ? "danger" : "secondary"}
              size="sm"
              busy={busyUserId === user.id}
              disabled={self}
              title={self ? "You cannot deactivate your own account" : undefined}
              onClick={() => onSetActive(user, !user.active)}
              aria-label={`${user.active ? "Deactivate" : "Reactivate"} ${user.name}`}
            >
              {user.active ? "Deactivate" : "Reactivate"}
            </Button>
          </span>
        );
      },
    }),
  ];

  return (
    <DataTable
      data={users}
      columns={columns}
      caption="Users"
      getRowId={(u) => String(u.id)}
      initialSorting={[{ id: "name", desc: false }]}
    />
  );
}
