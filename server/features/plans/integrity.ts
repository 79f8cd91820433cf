import type { DecisionRow, RevisionRow, decisionsOf } from "./plans.repo";
import { hashContent } from "./revision-content";
import { signatureStatus, type DecisionPayload, type SignatureStatus, type SigningKey } from "./signing";

type DecisionJoin = Awaited<ReturnType<typeof decisionsOf>>[number];

export interface CheckedDecision {
  approver: { id: number; name: string; email: string };
  decision: DecisionRow["decision"];
  round: number;
  signedHash: string;
  at: string;
  keyId: string | null;
  signature: string | null;
  signatureStatus: SignatureStatus;
  /** The exact object whose RFC 8785 canonical JSON the signature covers. */
  payload: DecisionPayload;
}

export const decisionPayload = (planId: number, revision: number, d: DecisionJoin["d"]): DecisionPayload => ({
  planId,
  revision,
  contentHash: d.signedHash,
  approverId: d.approverId,
  decision: d.decision,
  round: d.round,
  time: d.at.toISOString(),
});

const short = (h: string) => `${h.slice(0, 12)}…`;

/**
 * The three checks verify, export and the report share: (a) the stored content still hashes to the recorded hash,
 * (b) every approval of the revision's current round signed that same hash, (c) every decision's signature verifies.
 * Replacing content and hash together passes (a) but fails (b); also rewriting the signed hash fails (c).
 */
export function checkRevision(key: SigningKey, planId: number, rev: RevisionRow, decisions: DecisionJoin[]) {
  const computedHash = hashContent(rev.content);
  const problems: string[] = [];
  const hashIntact = computedHash === rev.contentHash;
  if (!hashIntact)
    problems.push(`the stored content hashes to ${short(computedHash)}, not to the recorded ${short(rev.contentHash)}`);
  const checked: CheckedDecision[] = decisions
    .filter((x) => x.d.revisionId === rev.id)
    .map(({ d, name, email }) => {
      const payload = decisionPayload(planId, rev.number, d);
      return {
        approver: { id: d.approverId, name, email },
        decision: d.decision,
        round: d.round,
        signedHash: d.signedHash,
        at: payload.time,
        keyId: d.keyId,
        signature: d.signature,
        signatureStatus: signatureStatus(key, payload, d.signature, d.keyId),
        payload,
      };
    });
  for (const d of checked) {
    // A withdrawn draft keeps its round number while its content changes, so only submitted content must match.
    const binding = d.decision === "approve" && d.round === rev.round && rev.state !== "draft";
    if (binding && d.signedHash !== computedHash) {
      problems.push(
        `${d.approver.name}'s approval signed ${short(d.signedHash)}, but the content hashes to ${short(computedHash)}`,
      );
    }
    if (d.signatureStatus === "invalid")
      problems.push(`${d.approver.name}'s decision (round ${d.round}) carries a signature that does not verify`);
    if (d.signatureStatus === "missing")
      problems.push(`${d.approver.name}'s decision (round ${d.round}) has no server signature`);
    if (d.signatureStatus === "unknown_key")
      problems.push(
        `${d.approver.name}'s decision (round ${d.round}) was signed by key ${short(d.keyId ?? "")}, not this server's key`,
      );
  }
  return { ok: problems.length === 0, hashIntact, computedHash, problems, decisions: checked, keyId: key.keyId };
}
