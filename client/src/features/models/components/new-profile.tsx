import type { ModelProfile } from "@shared/schemas/models";
import { useCreateModel } from "../api/create-model";
import { BLANK_PROFILE } from "./blank-profile";
import { ProfileForm } from "./profile-form";

/** A profile typed in by hand (no config file). */
export function NewProfile({ onCreated }: { onCreated: (model: ModelProfile) => void }) {
  const create = useCreateModel();
  return (
    <ProfileForm
      ariaLabel="New profile"
      defaultValues={BLANK_PROFILE}
      submitLabel="Create profile"
      busyLabel="Creating…"
      busy={create.isPending}
      onSubmit={async (values) => onCreated(await create.mutateAsync(values))}
    />
  );
}
