import { TextField, TextInput } from "@/components/field";

type SheetInputProps = {
  label: string;
  value: string;
  onChange: (text: string) => void;
  error?: string;
  /** Shown under the input: the default that applies when it is left blank, or the unit. */
  hint?: string;
  unit?: string;
  placeholder?: string;
  disabled?: boolean;
};

/** A labelled number box that keeps the text as typed; the sheet parses it when it builds the request. */
export function SheetInput({ label, value, onChange, error, hint, unit, placeholder, disabled }: SheetInputProps) {
  return (
    <TextField
      label={unit ? `${label} (${unit})` : label}
      error={error}
      hint={hint}
      inputMode="decimal"
      autoComplete="off"
      value={value}
      placeholder={placeholder}
      disabled={disabled}
      onChange={(e) => onChange(e.target.value)}
    />
  );
}

/** A bare input for a table cell: the accessible name comes from `label`, the error sits under it. */
export function CellInput({
  label,
  value,
  onChange,
  error,
  disabled,
}: Omit<SheetInputProps, "hint" | "unit" | "placeholder">) {
  return (
    <div className="flex min-w-24 flex-col gap-0.5">
      <TextInput
        aria-label={label}
        aria-invalid={Boolean(error)}
        title={error}
        inputMode="decimal"
        autoComplete="off"
        value={value}
        disabled={disabled}
        onChange={(e) => onChange(e.target.value)}
        className="px-2 py-1"
      />
      {error && <span className="text-note text-signal">{error}</span>}
    </div>
  );
}
