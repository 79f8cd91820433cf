/** One choice of a radio group, label beside the button. */
export function Radio({
  name,
  checked,
  onChange,
  label,
}: {
  name: string;
  checked: boolean;
  onChange: () => void;
  label: string;
}) {
  return (
    <label className="inline-flex cursor-pointer items-center gap-2 text-body">
      <input type="radio" name={name} checked={checked} onChange={onChange} className="size-4 accent-hemp" />
      {label}
    </label>
  );
}

/** A titled column of radios over `options`; the empty value is keyed "default" (the server's default). */
export function RadioColumn<V extends string>({
  name,
  title,
  ariaLabel = title,
  options,
  value,
  onChange,
}: {
  name: string;
  title: string;
  /** The group's accessible name, when it is shorter than the title. */
  ariaLabel?: string;
  options: { value: V; label: string }[];
  value: V;
  onChange: (value: V) => void;
}) {
  return (
    <div className="flex flex-col gap-1" role="radiogroup" aria-label={ariaLabel}>
      <span className="text-note font-semibold">{title}</span>
      {options.map((c) => (
        <Radio
          key={c.value || "default"}
          name={name}
          checked={value === c.value}
          onChange={() => onChange(c.value)}
          label={c.label}
        />
      ))}
    </div>
  );
}
