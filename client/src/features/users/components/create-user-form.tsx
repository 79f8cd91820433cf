import { useState } from "react";
import { Controller, useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { createUserRequestSchema } from "@shared/schemas/users";
import { PASSWORD_MIN } from "@shared/schemas/auth";
import { SubmitButton } from "@/components/button";
import { TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateUser } from "../api/create-user";
import { RoleCheckboxes } from "./role-checkboxes";

const FIELDS = ["name", "email", "password", "roles"] as const;

export function CreateUserForm() {
  const create = useCreateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const [created, setCreated] = useState<string | null>(null);
  const { register, control, handleSubmit, setError, reset, formState } = useForm({
    resolver: formResolver(createUserRequestSchema),
    defaultValues: { name: "", email: "", password: "", roles: [] },
  });
  const { errors } = formState;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    setCreated(null);
    create.mutate(values, {
      onSuccess: (user) => {
        reset();
        setCreated(`Added ${user.name} (${user.email}). Share the password with them by a separate channel.`);
      },
      onError: (error) => {
        // A taken e-mail is a 409; put it beside the e-mail even if the server names no field.
        if (isApiError(error) && error.status === 409 && !error.fields) {
          setError("email", { type: "server", message: error.message });
          return;
        }
        setFormError(applyApiErrors(error, setError, FIELDS));
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Add a user">
      {created && <Notice tone="success">{created}</Notice>}
      {formError && <Notice tone="alert">{formError}</Notice>}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register("name")} />
        <TextField
          label="E-mail"
          type="email"
          autoComplete="off"
          error={errors.email?.message}
          {...register("email")}
        />
        <TextField
          label="First password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${PASSWORD_MIN} characters; they can change it on their profile.`}
          error={errors.password?.message}
          {...register("password")}
        />
      </div>
      <Controller
        control={control}
        name="roles"
        render={({ field, fieldState }) => (
          <RoleCheckboxes value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
        )}
      />
      <div>
        <SubmitButton busy={create.isPending} busyLabel="Adding…">
          Add user
        </SubmitButton>
      </div>
    </form>
  );
}
