import { Page, Panel } from "@/components/page";
import { useCurrentUser, useRefreshSession } from "@/features/auth/hooks/use-session";
import { CreateUserForm } from "@/features/users/components/create-user-form";
import { ManageUsers } from "@/features/users/components/manage-users";

export function UsersRoute() {
  const me = useCurrentUser();
  const refreshSession = useRefreshSession();
  return (
    <Page
      title="Users"
      lead="Everyone who can sign in, and what their roles let them do. Roles add up: a user may hold several."
    >
      <Panel title="Add a user">
        <CreateUserForm />
      </Panel>
      <Panel title="All users">
        <ManageUsers
          currentUserId={me.id}
          onChanged={(user) => {
            if (user.id === me.id) void refreshSession();
          }}
        />
      </Panel>
    </Page>
  );
}
