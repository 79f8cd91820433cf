import { useNavigate } from "react-router-dom";
import { Page, Panel } from "@/components/page";
import { paths } from "@/config/paths";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { canEditProfiles, ImportConfig } from "@/features/models";
import { ProfileEditorsOnly } from "./models-editors-only";

export function ModelImportRoute() {
  const user = useCurrentUser();
  const navigate = useNavigate();
  if (!canEditProfiles(user.roles)) return <ProfileEditorsOnly />;
  return (
    <Page
      title="Import a config.json"
      lead="Ropewalk reads the rotary keys of a model's configuration file, tells you what looks wrong in it, and lets you correct the values before saving."
    >
      <Panel title="Config file">
        <ImportConfig onSaved={(m) => navigate(paths.model(m.id))} />
      </Panel>
    </Page>
  );
}
