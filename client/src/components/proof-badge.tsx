import { PROOF_LABELS, type ProofState } from "@shared/schemas/evidence-api";

/**
 * Proof is the rope-makers' test before a rope goes into service: after approval, a revision is proven once its
 * evaluations meet every acceptance criterion, or marked not proven with a reason. Null: no proof decision yet.
 */
export const PROOF_NONE_LABEL = "Awaiting proof";

const TONES: Record<ProofState | "none", string> = {
  proven: "bg-seaglass text-paper border-seaglass",
  unproven: "bg-signal-pale text-signal-dark border-signal/40",
  none: "bg-paper text-ink-soft border-rule-strong border-dashed",
};

export function ProofBadge({ proof }: { proof: ProofState | null }) {
  const key = proof ?? "none";
  return (
    <span
      data-proof={key}
      className={`inline-flex items-center rounded-full border px-2 py-0.5 text-note font-medium whitespace-nowrap ${TONES[key]}`}
    >
      {proof ? PROOF_LABELS[proof] : PROOF_NONE_LABEL}
    </span>
  );
}
