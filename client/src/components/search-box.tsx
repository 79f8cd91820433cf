import { TextField } from "./field";

type SearchBoxProps = {
  label: string;
  value: string;
  onChange: (text: string) => void;
  hint?: string;
  placeholder?: string;
};

/** A labelled search input for lists the server pages (profiles, users): typing narrows what is offered. */
export function SearchBox({ label, value, onChange, hint, placeholder }: SearchBoxProps) {
  return (
    <TextField
      type="search"
      label={label}
      hint={hint}
      placeholder={placeholder}
      value={value}
      autoComplete="off"
      onChange={(e) => onChange(e.target.value)}
    />
  );
}

/** The hint under a picker's search: how much of the list is offered. */
export const pickerHint = (shown: number, total: number, more: boolean, noun: string) =>
  more ? `Showing ${shown} of ${total}${total >= 10_000 ? "+" : ""} ${noun} by name; type to narrow.` : undefined;
