import { desc, eq } from "drizzle-orm";
import { revisionProofs, users } from "../../db/schema";
import type { Executor } from "../../db/client";
import { signatureStatus, type SigningKey } from "./signing";

/**
 * Proof decisions (issue 12) as the plans feature reads them for the printable report, and as the evidence feature
 * writes and lists them: one payload shape for signing and checking, one query.
 */

/** What a proof decision's signature covers: the approval payload with the verdict as decision and the evidence ids. */
export const proofPayload = (
  planId: number,
  n: number,
  p: { contentHash: string; approverId: number; verdict: string; evidenceIds: number[]; at: Date },
) => ({
  planId,
  revision: n,
  contentHash: p.contentHash,
  approverId: p.approverId,
  decision: `proof:${p.verdict}`,
  round: 0,
  time: p.at.toISOString(),
  evidenceIds: p.evidenceIds,
});

/** A revision's proof decisions, newest first, with the approver's name. */
export const proofsOf = (ex: Executor, revisionId: number) =>
  ex
    .select({ p: revisionProofs, byName: users.name })
    .from(revisionProofs)
    .innerJoin(users, eq(users.id, revisionProofs.approverId))
    .where(eq(revisionProofs.revisionId, revisionId))
    .orderBy(desc(revisionProofs.id));

/** The proof decisions of one revision with each signature checked against the server key. */
export async function checkedProofs(ex: Executor, key: SigningKey, planId: number, n: number, revisionId: number) {
  const rows = await proofsOf(ex, revisionId);
  return rows.map(({ p, byName }) => ({
    id: p.id,
    verdict: p.verdict as "proven" | "unproven",
    reason: p.reason,
    contentHash: p.contentHash,
    evidenceIds: p.evidenceIds,
    by: { id: p.approverId, name: byName },
    at: p.at.toISOString(),
    keyId: p.keyId,
    signatureStatus: signatureStatus(key, proofPayload(planId, n, p), p.signature, p.keyId),
  }));
}
