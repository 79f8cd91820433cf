/** A label followed by a long machine value (a hash, a fingerprint) that may break anywhere, tagged for tests. */
export function LabelledCode({
  label,
  value,
  testId,
  className = "",
}: {
  label: string;
  value: string;
  testId: string;
  className?: string;
}) {
  return (
    <p className={`text-note break-all text-ink-soft ${className}`}>
      {label}{" "}
      <code className="text-ink" data-testid={testId}>
        {value}
      </code>
    </p>
  );
}
