import type { Decision } from "@shared/schemas/plans";
import { formatDateTime, shortHash } from "@/lib/format";
import { DECISION_WORDS } from "@shared/review-words";

/** The server's signature on one decision, checked when the plan was read (docs/signing.md). */
function SignatureLine({ d }: { d: Decision }) {
  const key = d.keyId ? shortHash(d.keyId) : "";
  const text = {
    valid: (
      <span className="text-seaglass-dark">
        Server signature holds · key <code title={d.keyId ?? ""}>{key}</code>
      </span>
    ),
    invalid: (
      <span className="font-semibold text-signal-dark">
        Server signature does not hold: this record changed after it was signed
      </span>
    ),
    missing: <span className="font-semibold text-signal-dark">No server signature on this decision</span>,
    unknown_key: (
      <span className="font-semibold text-signal-dark">
        Signed with key <code title={d.keyId ?? ""}>{key}</code>, which this server does not hold
      </span>
    ),
  }[d.signatureStatus];
  return (
    <p className="mt-1 text-note" data-testid="signature-status" data-status={d.signatureStatus}>
      {text}
    </p>
  );
}

/** Each approver's decision with the exact content hash they signed and whether the server's signature holds; earlier rounds stay on record. */
export function DecisionsList({
  decisions,
  currentRound,
  contentHash,
}: {
  decisions: Decision[];
  currentRound: number;
  contentHash: string;
}) {
  if (decisions.length === 0) return <p className="text-body text-ink-soft">No decisions yet.</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label="Decisions">
      {decisions.map((d, i) => {
        const approve = d.decision === "approve";
        const matches = d.signedHash === contentHash;
        return (
          <li
            key={i}
            className={`rounded-md border px-3 py-2 ${approve ? "border-seaglass/40 bg-seaglass-pale/50" : "border-signal/40 bg-signal-pale/60"}`}
          >
            <p className="text-body">
              <span className="font-semibold">{DECISION_WORDS[d.decision].done}</span> by {d.approver.name}{" "}
              <span className="text-note text-ink-soft">
                ({d.approver.email}) · {formatDateTime(d.at)} · round {d.round}
                {d.round !== currentRound && " (earlier round)"}
              </span>
            </p>
            {d.comment && <p className="mt-1 text-body whitespace-pre-wrap">“{d.comment}”</p>}
            <p className="mt-1 text-note">
              Signed hash{" "}
              <code className="rounded bg-white/70 px-1 break-all" data-testid="signed-hash">
                {d.signedHash}
              </code>
              {!matches && (
                <span className="ml-2 font-semibold text-signal-dark">does not match this revision’s stored hash</span>
              )}
            </p>
            <SignatureLine d={d} />
          </li>
        );
      })}
    </ul>
  );
}
