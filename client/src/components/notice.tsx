import type { ReactNode } from "react";

type Tone = "info" | "success" | "alert";

const TONES: Record<Tone, string> = {
  info: "border-seaglass/40 bg-seaglass-pale text-ink",
  success: "border-seaglass/40 bg-seaglass-pale text-ink",
  alert: "border-signal/40 bg-signal-pale text-signal-dark",
};

/** A message box; alerts are announced immediately, the rest politely. */
export function Notice({ tone = "info", title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div
      role={tone === "alert" ? "alert" : "status"}
      className={`rounded-md border px-4 py-3 text-body ${TONES[tone]}`}
    >
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? "mt-1" : ""}>{children}</div>}
    </div>
  );
}

export function Loading({ label = "Loading…" }: { label?: string }) {
  return (
    <p role="status" className="animate-pulse py-6 text-body text-ink-soft">
      {label}
    </p>
  );
}

export function Chip({
  children,
  tone = "hemp",
}: {
  children: ReactNode;
  tone?: "hemp" | "seaglass" | "signal" | "muted";
}) {
  const tones = {
    signal: "bg-signal-pale text-signal-dark border-signal/30",
    hemp: "bg-hemp-pale text-hemp-dark border-hemp/30",
    seaglass: "bg-seaglass-pale text-seaglass-dark border-seaglass/30",
    muted: "bg-paper-deep text-ink-soft border-rule",
  };
  return (
    <span className={`inline-flex items-center rounded-full border px-2 py-0.5 text-note font-medium ${tones[tone]}`}>
      {children}
    </span>
  );
}
