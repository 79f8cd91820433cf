import type { ComponentProps } from "react";
import { Field } from "../../../components/field";

type SelectFieldProps = ComponentProps<"select"> & { label: string; error?: string; hint?: string };

/** A labelled select in the same frame as TextField. */
export function SelectField({ label, error, hint, className = "", children, ...select }: SelectFieldProps) {
  return (
    <Field label={label} error={error} hint={hint}>
      {({ id, describedBy, invalid }) => (
        <select
          id={id}
          aria-describedby={describedBy}
          aria-invalid={invalid}
          className={`w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body text-ink focus:border-seaglass focus:outline-2 focus:outline-seaglass/30 aria-[invalid=true]:border-signal ${className}`}
          {...select}
        >
          {children}
        </select>
      )}
    </Field>
  );
}
