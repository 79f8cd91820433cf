import { useNavigate } from "react-router-dom";
import { Page, Panel } from "@/components/page";
import { paths } from "@/config/paths";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { canEditProfiles, NewProfile } from "@/features/models";
import { ProfileEditorsOnly } from "./models-editors-only";

export function ModelNewRoute() {
  const user = useCurrentUser();
  const navigate = useNavigate();
  if (!canEditProfiles(user.roles)) return <ProfileEditorsOnly />;
  return (
    <Page
      title="Type a profile in"
      lead="For a model without a config file at hand. The rotary dimension and pairs follow from the head dimension and rotary fraction."
    >
      <Panel title="Profile">
        <NewProfile onCreated={(m) => navigate(paths.model(m.id))} />
      </Panel>
    </Page>
  );
}
