import { useState } from "react";
import { useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { loginRequestSchema, type SessionUser } from "@shared/schemas/auth";
import { SubmitButton } from "@/components/button";
import { TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { applyApiErrors } from "@/lib/form-errors";
import { isApiError } from "@/lib/api-client";
import { useLogin } from "../api/login";

/** Wrong password and unknown e-mail get one message on purpose: the server does not say which. */
function signInMessage(error: unknown): string | null {
  if (!isApiError(error)) return null;
  if (error.code === "invalid_credentials") return "That e-mail and password do not match an active account.";
  if (error.status === 429) return "Too many sign-in attempts. Wait a few minutes, then try again.";
  return null;
}

export function SignInForm({ onSignedIn }: { onSignedIn: (user: SessionUser) => void }) {
  const login = useLogin();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm({
    resolver: formResolver(loginRequestSchema),
    defaultValues: { email: "", password: "" },
  });
  const { errors } = formState;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    login.mutate(values, {
      onSuccess: ({ user }) => onSignedIn(user),
      onError: (error) => setFormError(signInMessage(error) ?? applyApiErrors(error, setError, ["email", "password"])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      {formError && <Notice tone="alert">{formError}</Notice>}
      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        error={errors.email?.message}
        {...register("email")}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register("password")}
      />
      <SubmitButton busy={login.isPending} busyLabel="Signing in…" className="mt-2">
        Sign in
      </SubmitButton>
    </form>
  );
}
