import { Page, Panel } from "../../components/page";
import { useCurrentUser } from "../../features/auth/hooks/use-session";
import { CreateUserForm } from "../../features/users/components/create-user-form";
import { ManageUsers } from "../../features/users/components/manage-users";

export function UsersRoute() {
  const me = useCurrentUser();
  return (
    <Page title="Users" lead="Everyone who can sign in, and what their roles let them do. Roles add up: a user may hold several.">
      <Panel title="Add a user">
        <CreateUserForm />
      </Panel>
      <Panel title="All users">
        <ManageUsers currentUserId={me.id} />
      </Panel>
    </Page>
  );
}
