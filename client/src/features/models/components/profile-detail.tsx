import { useState, type ReactNode } from "react";
import type { ModelProfile } from "@shared/schemas/models";
import { Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { apiPaths } from "@/config/paths";
import { useUpdateModel } from "../api/update-model";
import { profileInput } from "./blank-profile";
import { CurrentScalingNote } from "./current-scaling";
import { DeleteProfile } from "./delete-profile";
import { ProfileLayerGroups } from "./profile-layer-groups";
import { ImportWarnings } from "./import-warnings";
import { ProfileFacts } from "./profile-facts";
import { ProfileForm } from "./profile-form";

type ProfileDetailProps = {
  model: ModelProfile;
  /** Researchers, infra leads and admins edit; the server checks again. */
  canEdit: boolean;
  onDeleted: () => void;
  /** Links the route adds beside the facts (e.g. open in the workbench). */
  actions?: ReactNode;
};

export function ProfileDetail({ model, canEdit, onDeleted, actions }: ProfileDetailProps) {
  const update = useUpdateModel();
  const [saved, setSaved] = useState(false);
  return (
    <div className="flex flex-col gap-6">
      {model.retiredAt && (
        <Notice title="This profile is retired">
          Plans that use it keep working and the workbench still opens it, but it is no longer offered where a profile
          is picked.
        </Notice>
      )}
      <Panel title="At a glance" aside={actions}>
        <div className="flex flex-col gap-4">
          <ProfileFacts model={model} />
          <ProfileLayerGroups groups={model.layerGroups} />
        </div>
      </Panel>
      {model.sourceFileName && (
        <Panel title="Imported from a config file">
          <div className="flex flex-col gap-4">
            <ImportWarnings
              warnings={model.importWarnings}
              sourceHref={apiPaths.modelSource(model.id)}
              sourceFileName={model.sourceFileName}
              title="Warnings raised at import"
            />
            <CurrentScalingNote scaling={model.currentScaling} />
          </div>
        </Panel>
      )}
      {canEdit && (
        <Panel title="Edit the profile">
          <div className="flex flex-col gap-3">
            {saved && (
              <Notice tone="success">
                Saved. Analyses use the new values from now on; plans keep the values they were drafted with.
              </Notice>
            )}
            <ProfileForm
              key={model.updatedAt}
              ariaLabel="Edit profile"
              defaultValues={profileInput(model)}
              submitLabel="Save changes"
              busyLabel="Saving…"
              busy={update.isPending}
              onSubmit={async (values) => {
                setSaved(false);
                await update.mutateAsync({ id: model.id, values });
                setSaved(true);
              }}
            />
          </div>
        </Panel>
      )}
      {canEdit && (
        <Panel title={model.retiredAt ? "Retired" : "Delete"}>
          <DeleteProfile model={model} onDeleted={onDeleted} />
        </Panel>
      )}
    </div>
  );
}
