import { useState } from "react";
import { Controller, useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { createUserRequestSchema, type User } from "@shared/schemas/users";
import { Button } from "@/components/button";
import { Notice } from "@/components/notice";
import { applyApiErrors } from "@/lib/form-errors";
import { useUpdateUser } from "../api/update-user";
import { RoleCheckboxes } from "./role-checkboxes";

// Same rules for roles as when creating a user.
const rolesSchema = createUserRequestSchema.pick({ roles: true });

export function RoleEditor({
  user,
  onDone,
  onSaved,
}: {
  user: User;
  onDone: () => void;
  onSaved?: (user: User) => void;
}) {
  const update = useUpdateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm({
    resolver: formResolver(rolesSchema),
    defaultValues: { roles: user.roles },
  });

  const onSubmit = handleSubmit(({ roles }) => {
    setFormError(null);
    update.mutate(
      { id: user.id, changes: { roles } },
      {
        onSuccess: (saved) => {
          onSaved?.(saved);
          onDone();
        },
        onError: (error) => setFormError(applyApiErrors(error, setError, ["roles"])),
      },
    );
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="flex flex-col gap-3 rounded-md border border-hemp/40 bg-hemp-pale/40 p-4"
      aria-label={`Roles of ${user.name}`}
    >
      {formError && <Notice tone="alert">{formError}</Notice>}
      <Controller
        control={control}
        name="roles"
        render={({ field, fieldState }) => (
          <RoleCheckboxes
            value={field.value}
            onChange={field.onChange}
            error={fieldState.error?.message}
            legend={`Roles of ${user.name} (${user.email})`}
          />
        )}
      />
      <div className="flex gap-2">
        <Button type="submit" size="sm" busy={update.isPending}>
          Save roles
        </Button>
        <Button variant="secondary" size="sm" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
