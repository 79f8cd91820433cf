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

/** The draft's fields that hold text as typed (not the radio choices), so a row of boxes can edit them. */
type TextKey<D> = { [K in keyof D]: string extends D[K] ? K : never }[keyof D] & string;

/** One box of a SheetFieldRow: the draft field it edits, and its words. */
export type SheetField<D> = {
  field: TextKey<D>;
  label: string;
  unit?: string;
  hint?: string;
  placeholder?: string;
  /** Request fields whose issue shows under the box, the first that has one; default: the field itself. */
  issueKeys?: string[];
};

type SheetFieldRowProps<D> = {
  fields: SheetField<D>[];
  draft: D;
  onChange: (next: D) => void;
  issues: Record<string, string>;
  /** The grid the boxes sit in. */
  className: string;
};

/** A grid of labelled number boxes over one draft object: each box edits its field and shows its field's issue. */
export function SheetFieldRow<D>({ fields, draft, onChange, issues, className }: SheetFieldRowProps<D>) {
  return (
    <div className={className}>
      {fields.map(({ field, issueKeys = [field], ...words }) => (
        <SheetInput
          key={field}
          {...words}
          value={draft[field] as string}
          onChange={(text) => onChange({ ...draft, [field]: text })}
          error={issueKeys.map((k) => issues[k]).find((e) => e !== undefined)}
        />
      ))}
    </div>
  );
}
