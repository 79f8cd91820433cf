import { Fragment, useId, type ReactNode } from "react";

/**
 * Where the button sits beside its label: centred on one line, or on the first line of a label that wraps (a sentence
 * in a narrow dialog), where a centred button would float between its lines.
 */
type RadioAlign = "center" | "start";

/** One choice of a radio group, label beside the button. */
export function Radio({
  name,
  checked,
  onChange,
  label,
  disabled = false,
  align = "center",
  describedBy,
}: {
  name: string;
  checked: boolean;
  onChange: () => void;
  label: string;
  /** Shown but not choosable; the label is dimmed to say so. */
  disabled?: boolean;
  align?: RadioAlign;
  /** The id of a line that says more about this choice (read out with it). */
  describedBy?: string;
}) {
  const labelClass = `inline-flex ${disabled ? "" : "cursor-pointer "}${align === "start" ? "items-start" : "items-center"} gap-2 text-body${disabled ? " text-ink-soft" : ""}`;
  return (
    <label className={labelClass}>
      <input
        type="radio"
        name={name}
        checked={checked}
        onChange={onChange}
        disabled={disabled || undefined}
        aria-describedby={describedBy}
        className={align === "start" ? "mt-1 size-4 shrink-0 accent-hemp" : "size-4 accent-hemp"}
      />
      {label}
    </label>
  );
}

/** One option of a RadioColumn. */
export type RadioOption<V extends string> = {
  value: V;
  label: string;
  /** A line under the option saying more about it (why it is not open, say); it describes the button. */
  description?: ReactNode;
  disabled?: boolean;
};

/** A titled column of radios over `options`; the empty value is keyed "default" (the server's default). */
export function RadioColumn<V extends string>({
  name,
  title,
  ariaLabel = title,
  options,
  value,
  onChange,
  align,
}: {
  name: string;
  title: string;
  /** The group's accessible name, when it is shorter than the title. */
  ariaLabel?: string;
  options: RadioOption<V>[];
  value: V;
  onChange: (value: V) => void;
  align?: RadioAlign;
}) {
  const uid = useId();
  const descriptionId = (c: RadioOption<V>) => `${uid}-${c.value || "default"}-about`;
  return (
    <div className="flex flex-col gap-1" role="radiogroup" aria-label={ariaLabel}>
      <span className="text-note font-semibold">{title}</span>
      {options.map((c) => (
        <Fragment key={c.value || "default"}>
          <Radio
            name={name}
            checked={value === c.value}
            onChange={() => onChange(c.value)}
            label={c.label}
            disabled={c.disabled}
            align={align}
            describedBy={c.description ? descriptionId(c) : undefined}
          />
          {c.description && (
            <p id={descriptionId(c)} className="pl-6 text-note text-ink-soft">
              {c.description}
            </p>
          )}
        </Fragment>
      ))}
    </div>
  );
}
