import type { RevisionState } from "@shared/schemas/plans";
import { STATE_MEANINGS, STATE_WORDS } from "@shared/review-words";

/** The states' words come from the one glossary (docs/review-words.md); the API values stay. */
export const STATE_LABELS: Record<RevisionState, string> = STATE_WORDS;

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
      title={STATE_MEANINGS[state]}
      className={`inline-flex items-center rounded-full border px-2 py-0.5 text-note font-medium whitespace-nowrap ${TONES[state]}`}
    >
      {STATE_LABELS[state]}
    </span>
  );
}
