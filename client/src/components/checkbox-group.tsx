import type { ReactNode } from "react";
import { Checkbox } from "./field";

/**
 * A fieldset of checkboxes whose value is the list of checked options, in the options' order. Controlled (value and
 * onChange, e.g. through react-hook-form's Controller): a lone registered checkbox would turn into a string or a boolean,
 * so the value stays a list even when there is one option.
 */
export function CheckboxGroup<T extends string>({
  legend,
  name,
  options,
  value,
  onChange,
  label,
  error,
}: {
  legend: ReactNode;
  name: string;
  options: readonly T[];
  value: readonly T[];
  onChange: (v: T[]) => void;
  label: (option: T) => ReactNode;
  error?: string;
}) {
  const toggle = (option: T, on: boolean) => onChange(options.filter((o) => (o === option ? on : value.includes(o))));
  return (
    <fieldset className="flex flex-col gap-2" aria-invalid={Boolean(error)}>
      <legend className="mb-1 text-note font-semibold text-ink">{legend}</legend>
      <div className="flex flex-wrap gap-x-5 gap-y-2">
        {options.map((option) => (
          <Checkbox
            key={option}
            name={name}
            value={option}
            checked={value.includes(option)}
            onChange={(e) => toggle(option, e.target.checked)}
            label={label(option)}
          />
        ))}
      </div>
      {error && (
        <p className="text-note text-signal" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}
