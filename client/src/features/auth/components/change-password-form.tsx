import { useState } from "react";
import { useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { z } from "zod";
import { changePasswordRequestSchema, PASSWORD_MIN } from "@shared/schemas/auth";
import { SubmitButton } from "@/components/button";
import { TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { applyApiErrors } from "@/lib/form-errors";
import { isApiError } from "@/lib/api-client";
import { useChangePassword } from "../api/change-password";

// The request contract plus a typed-twice check that never leaves the browser.
const formSchema = changePasswordRequestSchema
  .extend({ confirmPassword: z.string() })
  .refine((v) => v.newPassword === v.confirmPassword, {
    path: ["confirmPassword"],
    message: "does not match the new password",
  });

const FIELDS = ["currentPassword", "newPassword", "confirmPassword"] as const;

export function ChangePasswordForm() {
  const change = useChangePassword();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const { register, handleSubmit, setError, reset, formState } = useForm({
    resolver: formResolver(formSchema),
    defaultValues: { currentPassword: "", newPassword: "", confirmPassword: "" },
  });
  const { errors } = formState;

  const onSubmit = handleSubmit(({ currentPassword, newPassword }) => {
    setFormError(null);
    setDone(false);
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => {
          reset();
          setDone(true);
        },
        onError: (error) => {
          if (isApiError(error) && error.code === "invalid_credentials") {
            setError("currentPassword", { type: "server", message: "is not your current password" });
            return;
          }
          setFormError(applyApiErrors(error, setError, FIELDS));
        },
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-md flex-col gap-4" aria-label="Change password">
      {done && <Notice tone="success">Password changed. Use the new one next time you sign in.</Notice>}
      {formError && <Notice tone="alert">{formError}</Notice>}
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        error={errors.currentPassword?.message}
        {...register("currentPassword")}
      />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        error={errors.newPassword?.message}
        {...register("newPassword")}
      />
      <TextField
        label="New password, again"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...register("confirmPassword")}
      />
      <div>
        <SubmitButton busy={change.isPending} busyLabel="Saving…">
          Change password
        </SubmitButton>
      </div>
    </form>
  );
}
