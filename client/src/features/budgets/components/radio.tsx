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
