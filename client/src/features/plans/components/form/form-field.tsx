import { get, useFormContext, type FieldValues } from "react-hook-form";
import { TextField } from "@/components/field";
import { toNumber } from "@/features/plans/lib/form-values";

type NumberFieldProps = { name: string; label: string; hint?: string; step?: string; placeholder?: string };

/** Error message at a dotted path, for fields whose path is built at run time (field arrays, method parameters). */
export function useFieldError(name: string): string | undefined {
  const { formState } = useFormContext<FieldValues>();
  return (get(formState.errors, name) as { message?: string } | undefined)?.message;
}

/** A number input registered at `name`; an empty box means "not given". */
export function NumberField({ name, label, hint, step = "any", placeholder }: NumberFieldProps) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  return (
    <TextField
      label={label}
      hint={hint}
      error={error}
      type="number"
      inputMode="decimal"
      step={step}
      placeholder={placeholder}
      {...register(name, { setValueAs: toNumber })}
    />
  );
}

/** A text input registered at `name`. */
export function TextFormField({ name, label, hint }: { name: string; label: string; hint?: string }) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  return <TextField label={label} hint={hint} error={error} {...register(name)} />;
}
