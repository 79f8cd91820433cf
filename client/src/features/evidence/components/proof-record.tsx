import type { Proof, ProofState } from "@shared/schemas/evidence-api";
import { ProofBadge } from "@/components/proof-badge";
import { formatDateTime, shortHash } from "@/lib/format";

const SIGNATURE_WORDS: Record<Proof["signatureStatus"], string> = {
  valid: "signature holds",
  invalid: "SIGNATURE DOES NOT HOLD",
  missing: "no signature",
  unknown_key: "signed with a key this server does not know",
};

/**
 * The revision's proof state and every proof decision, each with what it signed and whether the signature holds.
 * `proofs` come newest first, as GET …/evidence lists them.
 */
export function ProofRecord({ proof, proofs }: { proof: ProofState | null; proofs: Proof[] }) {
  return (
    <div className="flex flex-col gap-2" data-testid="proof-record">
      <p className="flex flex-wrap items-center gap-2 text-body">
        <ProofBadge proof={proof} />
        {proofs.length === 0 && (
          <span className="text-note text-ink-soft">No approver has proof-tested this revision yet.</span>
        )}
      </p>
      {proofs.length > 0 && (
        // One line per decision, newest first: who, when, what was signed, and whether the signature still holds.
        <ol className="flex flex-col gap-1 text-note text-ink-soft" aria-label="Proof decisions">
          {proofs.map((p, i) => (
            <li key={p.id} data-proof-decision={p.id}>
              {p.verdict === "proven" ? "Proven" : "Not proven"} by {p.by.name}, {formatDateTime(p.at)}: signed hash{" "}
              <code title={p.contentHash}>{shortHash(p.contentHash)}</code> over evidence{" "}
              {p.evidenceIds.length ? p.evidenceIds.map((id) => `#${id}`).join(", ") : "none"} ·{" "}
              <span
                data-testid={i === 0 ? "proof-signature" : undefined}
                data-signature={p.signatureStatus}
                className={p.signatureStatus === "valid" ? "text-seaglass-dark" : "font-semibold text-signal-dark"}
              >
                {SIGNATURE_WORDS[p.signatureStatus]}
              </span>{" "}
              <span className="break-all">(key {p.keyId})</span>
              {p.reason && <span className="block pl-3 text-ink">“{p.reason}”</span>}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
