import type { RevisionState } from "@shared/schemas/plans";

export const STATE_LABELS: Record<RevisionState, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  changes_requested: "Changes requested",
  superseded: "Superseded",
};

const TONES: Record<RevisionState, string> = {
  draft: "bg-paper-deep text-ink-soft border-rule-strong",
  in_review: "bg-seaglass-pale text-seaglass-dark border-seaglass/40",
  approved: "bg-hemp text-paper border-hemp",
  changes_requested: "bg-signal-pale text-signal-dark border-signal/40",
  superseded: "bg-paper text-ink-soft border-rule line-through decoration-ink-soft/50",
};

/** A revision's state in words, tinted so the list can be scanned. */
export function StateBadge({ state }: { state: RevisionState }) {
  return (
    <span
      data-state={state}
      className={`inline-flex items-center rounded-full border px-2 py-0.5 text-note font-medium whitespace-nowrap ${TONES[state]}`}
    >
      {STATE_LABELS[state]}
    </span>
  );
}
