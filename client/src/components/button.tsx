import type { ComponentProps } from "react";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-hemp text-paper border-hemp hover:bg-hemp-dark hover:border-hemp-dark",
  secondary: "bg-paper text-ink border-rule-strong hover:border-hemp hover:text-hemp-dark",
  quiet: "bg-transparent text-seaglass border-transparent hover:bg-seaglass-pale",
  danger: "bg-paper text-signal border-signal/50 hover:bg-signal-pale",
};

type ButtonProps = ComponentProps<"button"> & { variant?: Variant; size?: "md" | "sm"; busy?: boolean };

export function Button({
  variant = "primary",
  size = "md",
  busy = false,
  className = "",
  disabled,
  children,
  type = "button",
  ...rest
}: ButtonProps) {
  const sizing = size === "sm" ? "px-2.5 py-1 text-note" : "px-4 py-2 text-body";
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-md border font-medium transition-colors
        focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-seaglass
        disabled:cursor-not-allowed disabled:opacity-60 ${sizing} ${VARIANTS[variant]} ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}

/** A form's submit button that says what it is doing while the request runs. */
export function SubmitButton({
  busy,
  busyLabel,
  children,
  className,
}: {
  busy: boolean;
  busyLabel: string;
  children: string;
  className?: string;
}) {
  return (
    <Button type="submit" busy={busy} className={className}>
      {busy ? busyLabel : children}
    </Button>
  );
}
