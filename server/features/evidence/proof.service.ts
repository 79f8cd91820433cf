import type { AppDeps } from "../../deps";
import { recordAudit } from "../../platform/audit";
import { AppError, Forbidden } from "../../platform/errors";
import { hasRole } from "../../platform/roles";
import type { SessionUser } from "../../../shared/schemas";
import type { ProofState } from "../../../shared/schemas/evidence-api";
import { mustPlan, mustRevision, notify, proofPayload, signingKey, signPayload, touchPlan, userRef } from "../plans";
import * as repo from "./evidence.repo";
import { revisionEvidence } from "./evidence.service";
import { updateProof } from "./proof.repo";

/**
 * An approver's proof decision on an approved revision. `proven` needs every criterion to pass on the evidence as it is
 * now, and the approver must have read exactly that evidence (the ids they send) and content (the hash); `unproven`
 * carries a reason. Signed with the server key like approvals; audited and mailed in the same transaction.
 */
export async function decideProof(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number,
  input: { verdict: ProofState; reason: string; contentHash: string; evidenceIds: number[] },
) {
  if (!hasRole(actor, "approver")) throw new Forbidden("only approvers decide whether a revision is proven");
  return deps.db.transaction(async (tx) => {
    const plan = await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    if (rev.authorId === actor.id) throw new Forbidden("nobody proves a revision they authored");
    if (rev.state !== "approved")
      throw new AppError(
        "conflict",
        "not_approved",
        `revision ${n} is ${rev.state}; only an approved revision is proven`,
        {
          state: rev.state,
        },
      );
    if (input.contentHash !== rev.contentHash)
      throw new AppError("conflict", "hash_mismatch", `revision ${n} has content hash ${rev.contentHash}`, {
        contentHash: `current is ${rev.contentHash}`,
      });
    const current = await revisionEvidence(tx, deps, planId, n);
    const ids = current.evidence.map((e) => e.id);
    const read = [...new Set(input.evidenceIds)].sort((a, b) => a - b);
    if (read.length !== ids.length || read.some((id, i) => id !== ids[i]))
      throw new AppError(
        "conflict",
        "evidence_changed",
        "the evidence changed since you read it; reload and look again",
        {
          evidenceIds: `current evidence is [${ids.join(", ")}]`,
        },
      );
    if (input.verdict === "proven") {
      const open = current.criteria.filter((c) => c.status !== "pass");
      if (current.criteria.length === 0)
        throw new AppError("conflict", "criteria_not_met", "the revision states no acceptance criteria to prove", {
          verdict: "no criteria",
        });
      if (open.length)
        throw new AppError(
          "conflict",
          "criteria_not_met",
          `criteria ${open.map((c) => `#${c.index + 1} (${c.status})`).join(", ")} do not pass`,
          { verdict: open.map((c) => `#${c.index + 1}: ${c.reason}`).join("; ") },
        );
    }
    const at = new Date();
    const key = signingKey(deps.config.signingKeyFile);
    const signature = signPayload(
      key,
      proofPayload(planId, n, { ...input, evidenceIds: read, approverId: actor.id, at, contentHash: rev.contentHash }),
    );
    const proof = await repo.insertProof(tx, {
      revisionId: rev.id,
      approverId: actor.id,
      verdict: input.verdict,
      reason: input.reason,
      contentHash: rev.contentHash,
      evidenceIds: read,
      at,
      signature,
      keyId: key.keyId,
    });
    await updateProof(tx, rev.id, input.verdict);
    await touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: input.verdict === "proven" ? "revision.proven" : "revision.unproven",
      subjectType: "plan",
      subjectId: planId,
      detail: {
        revision: n,
        proof: proof.id,
        contentHash: rev.contentHash,
        evidenceIds: read,
        reason: input.reason,
        keyId: key.keyId,
      },
    });
    const people = await Promise.all([plan.ownerId, rev.authorId].map((id) => userRef(tx, id)));
    const to = [...new Set(people.filter((u) => u).map((u) => u!.email))];
    await notify(deps, tx, input.verdict, to, { plan, revision: rev, actorName: actor.name, comment: input.reason });
    return {
      revision: n,
      proof: input.verdict,
      decision: {
        id: proof.id,
        verdict: input.verdict,
        reason: input.reason,
        contentHash: rev.contentHash,
        evidenceIds: read,
        by: { id: actor.id, name: actor.name },
        at: at.toISOString(),
        keyId: key.keyId,
        signatureStatus: "valid" as const,
      },
    };
  });
}
