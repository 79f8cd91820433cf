import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import type { User } from "@shared/schemas/users";
import { Loading, Notice } from "@/components/notice";
import { Pager } from "@/components/pager";
import { SearchBox } from "@/components/search-box";
import { usePagedSearch } from "@/lib/use-paged-search";
import { usersQueries } from "../api/queries";
import { useUpdateUser } from "../api/update-user";
import { RoleEditor } from "./role-editor";
import { UsersTable } from "./users-table";

const PAGE_SIZE = 50;

/**
 * The user list with its row actions: change roles, deactivate, reactivate.
 * `onChanged` hears about every saved change (the page uses it to refresh the session when you edit yourself).
 */
export function ManageUsers({ currentUserId, onChanged }: { currentUserId: number; onChanged?: (user: User) => void }) {
  const paged = usePagedSearch(PAGE_SIZE);
  const users = useQuery(usersQueries.list(paged.query));
  const update = useUpdateUser();
  const [editing, setEditing] = useState<User | null>(null);
  const [message, setMessage] = useState<{ tone: "success" | "alert"; text: string } | null>(null);

  const searchBox = (
    <div className="max-w-md">
      <SearchBox label="Find a person" {...paged.searchBox} placeholder="part of a name or e-mail" />
    </div>
  );
  if (users.isPending) return <Loading label="Loading users…" />;
  if (users.isError)
    return (
      <Notice tone="alert" title="Could not load users">
        {users.error.message}
      </Notice>
    );

  const pager = paged.pager(users.data);
  const setActive = (user: User, active: boolean) => {
    setMessage(null);
    update.mutate(
      { id: user.id, changes: { active } },
      {
        onSuccess: (u) => {
          onChanged?.(u);
          setMessage({
            tone: "success",
            text: `${u.name} is ${u.active ? "active again" : "deactivated and can no longer sign in"}.`,
          });
        },
        onError: (e) => setMessage({ tone: "alert", text: e.message }),
      },
    );
  };

  return (
    <div className="flex flex-col gap-4">
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {searchBox}
      {editing && <RoleEditor key={editing.id} user={editing} onDone={() => setEditing(null)} onSaved={onChanged} />}
      <UsersTable
        users={users.data.users}
        currentUserId={currentUserId}
        busyUserId={update.isPending ? (update.variables?.id ?? null) : null}
        onEditRoles={(u) => {
          setMessage(null);
          setEditing(u);
        }}
        onSetActive={setActive}
      />
      {pager && <Pager {...pager} noun="People" />}
    </div>
  );
}
