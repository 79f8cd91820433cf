import { useId, type ComponentProps, type ReactNode } from "react";

type FieldProps = {
  label: string;
  error?: string;
  hint?: string;
  children: (ids: { id: string; describedBy: string | undefined; invalid: boolean }) => ReactNode;
};

/** Label, control, hint and error in one place, wired together for screen readers. */
export function Field({ label, error, hint, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-note font-semibold text-ink">
        {label}
      </label>
      {children({ id, describedBy, invalid: Boolean(error) })}
      {hint && !error && (
        <p id={hintId} className="text-note text-ink-soft">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-note text-signal" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

export function TextInput({ className = "", ...rest }: ComponentProps<"input">) {
  return (
    <input
      className={`w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body text-ink
        placeholder:text-ink-soft/70 focus:border-seaglass focus:outline-2 focus:outline-seaglass/30
        aria-[invalid=true]:border-signal ${className}`}
      {...rest}
    />
  );
}

const SELECT_CLASS =
  "w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body text-ink focus:border-seaglass focus:outline-2 focus:outline-seaglass/30 aria-[invalid=true]:border-signal";

export function SelectInput({ className = "", ...rest }: ComponentProps<"select">) {
  return <select className={`${SELECT_CLASS} ${className}`} {...rest} />;
}

type SelectFieldProps = ComponentProps<"select"> & { label: string; error?: string; hint?: string };

/** A labelled select in the same frame as TextField; spread `register(name)` into it or control it. */
export function SelectField({ label, error, hint, ...select }: SelectFieldProps) {
  return (
    <Field label={label} error={error} hint={hint}>
      {({ id, describedBy, invalid }) => (
        <SelectInput id={id} aria-describedby={describedBy} aria-invalid={invalid} {...select} />
      )}
    </Field>
  );
}

type ChoiceFieldProps = {
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** The first, empty choice: what it means ("Anyone", "Pick one…"). */
  emptyLabel: string;
  options: { value: string; label: string }[];
  error?: string;
  hint?: string;
  className?: string;
};

/** A controlled select whose first option is the empty choice. */
export function ChoiceField({ emptyLabel, options, onChange, ...rest }: ChoiceFieldProps) {
  return (
    <SelectField {...rest} onChange={(e) => onChange(e.target.value)}>
      <option value="">{emptyLabel}</option>
      {options.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </SelectField>
  );
}

type TextFieldProps = ComponentProps<"input"> & { label: string; error?: string; hint?: string };

/** A labelled text input with hint and error; spread react-hook-form's `register(name)` into it. */
export function TextField({ label, error, hint, ...input }: TextFieldProps) {
  return (
    <Field label={label} error={error} hint={hint}>
      {({ id, describedBy, invalid }) => (
        <TextInput id={id} aria-describedby={describedBy} aria-invalid={invalid} {...input} />
      )}
    </Field>
  );
}

type TextAreaFieldProps = ComponentProps<"textarea"> & { label: string; error?: string; hint?: string };

/** A labelled multi-line input in the same frame as TextField; spread `register(name)` into it. */
export function TextAreaField({ label, error, hint, className = "", rows = 3, ...area }: TextAreaFieldProps) {
  return (
    <Field label={label} error={error} hint={hint}>
      {({ id, describedBy, invalid }) => (
        <textarea
          id={id}
          rows={rows}
          aria-describedby={describedBy}
          aria-invalid={invalid}
          className={`w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body text-ink placeholder:text-ink-soft/70
            focus:border-seaglass focus:outline-2 focus:outline-seaglass/30 aria-[invalid=true]:border-signal ${className}`}
          {...area}
        />
      )}
    </Field>
  );
}

type CheckboxProps = ComponentProps<"input"> & { label: ReactNode };

export function Checkbox({ label, className = "", ...rest }: CheckboxProps) {
  return (
    <label className={`inline-flex cursor-pointer items-center gap-2 text-body text-ink ${className}`}>
      <input type="checkbox" className="size-4 accent-hemp" {...rest} />
      {label}
    </label>
  );
}
