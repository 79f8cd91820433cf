import { useState } from "react";
import { TextField } from "@/components/field";
import { sig3 } from "@/lib/format";
import { parseNumberText } from "@/lib/number-text";

type Props = {
  label: string;
  unit: string;
  /** Base units per displayed unit (2^30 for GiB, 1e12 for TFLOP/s). */
  scale: number;
  value: number | undefined;
  onChange: (baseValue: number | undefined) => void;
  onBlur?: () => void;
  error?: string;
  hint?: string;
};

/**
 * A number typed in a friendly unit and stored in the base unit the contract uses (bytes, FLOP/s).
 * The text is kept as typed; the form remounts it (by key) when it loads another record.
 */
export function UnitNumberInput({ label, unit, scale, value, onChange, onBlur, error, hint }: Props) {
  const [text, setText] = useState(value === undefined ? "" : sig3(value / scale));
  return (
    <TextField
      label={`${label} (${unit})`}
      error={error}
      hint={hint}
      inputMode="decimal"
      autoComplete="off"
      value={text}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        const typed = parseNumberText(e.target.value);
        // Whole base units: the contract wants an integer byte count (NaN stays NaN for the schema to name).
        onChange(typed === undefined ? undefined : Math.round(typed * scale));
      }}
    />
  );
}
