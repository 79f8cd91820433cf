import type { AppDeps } from "../../deps";
import { AppError, Conflict, Forbidden } from "../../platform/errors";
import { hasRole } from "../../platform/roles";
import { recordAudit } from "../../platform/audit";
import type { SessionUser } from "../../../shared/schemas";
import * as repo from "./plans.repo";
import { effectiveApprovals, makeContent, mustPlan, mustRevision, revisionValues } from "./plans.service";
import { hashContent, type RevisionContent } from "./revision-content";
import { askedReviewers, notify } from "./notify";
import { refuseRetiredAccelerator } from "./budget-part";
import { signingKey, signPayload } from "./signing";

const wrongState = (n: number, state: string, wanted: string) =>
  new Conflict(`revision ${n} is ${state}; this needs it ${wanted}`, { state });

/** draft → in_review, by the author. Opens a new decision round. */
export async function submit(deps: AppDeps, actor: SessionUser, planId: number, n: number) {
  return deps.db.transaction(async (tx) => {
    const plan = await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    if (rev.authorId !== actor.id) throw new Forbidden("only the revision's author submits it");
    if (rev.state !== "draft") throw wrongState(n, rev.state, "draft");
    // The budget is frozen at submission with the catalog as it is now; the hash covers it.
    let content = rev.content as RevisionContent;
    await refuseRetiredAccelerator(tx, content.budget?.inputs, "submit");
    if (content.budget) content = await makeContent(tx, content.model, revisionValues(content));
    const contentHash = hashContent(content);
    const sentBack = await repo.sentBackWithHash(tx, planId, contentHash);
    if (sentBack) {
      throw new Conflict(
        `nothing changed since revision ${sentBack.number} was sent back for changes (round ${sentBack.round}, content ${contentHash.slice(0, 12)}…); change what was asked for before submitting again`,
        { contentHash: "same as the content sent back" },
      );
    }
    const row = await repo.updateRevision(tx, rev.id, {
      state: "in_review",
      round: rev.round + 1,
      submittedAt: new Date(),
      content,
      contentHash,
    });
    await repo.touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "revision.submitted",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, hash: row.contentHash, round: row.round },
    });
    const approvers = (await repo.activeUsersWithRole(tx, "approver")).filter((u) => u.id !== actor.id);
    await notify(
      deps,
      tx,
      "review_requested",
      approvers.map((u) => u.email),
      { plan, revision: row, actorName: actor.name },
    );
    return { number: n, state: row.state };
  });
}

/**
 * in_review → draft, by the author. Decisions already made stay on record but belong to the closed round.
 * The approvers who were asked hear that nothing waits for them any more.
 */
export async function withdraw(deps: AppDeps, actor: SessionUser, planId: number, n: number) {
  return deps.db.transaction(async (tx) => {
    const plan = await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    if (rev.authorId !== actor.id) throw new Forbidden("only the revision's author withdraws it");
    if (rev.state !== "in_review") throw wrongState(n, rev.state, "in_review");
    const row = await repo.updateRevision(tx, rev.id, { state: "draft", version: rev.version + 1 });
    await repo.touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "revision.withdrawn",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, round: rev.round },
    });
    // Mail queued before the outbox knew its plan has no row to read: then every active approver but the author.
    const asked =
      (await askedReviewers(tx, planId, n)) ??
      (await repo.activeUsersWithRole(tx, "approver")).filter((u) => u.id !== actor.id).map((u) => u.email);
    await notify(deps, tx, "withdrawn", asked, { plan, revision: row, actorName: actor.name });
    return { number: n, state: row.state, version: row.version };
  });
}

/**
 * An approver's decision on the exact content hash under review. With the revision row locked, the quorum check,
 * the state change and superseding the earlier approval happen at once, so concurrent decisions cannot overshoot.
 */
export async function decide(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number,
  input: { decision: "approve" | "request_changes"; comment: string; contentHash: string },
) {
  if (!hasRole(actor, "approver")) throw new Forbidden("only approvers decide");
  return deps.db.transaction(async (tx) => {
    const plan = await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    if (rev.authorId === actor.id) throw new Forbidden("nobody decides on a revision they authored");
    if (rev.state !== "in_review") throw wrongState(n, rev.state, "in_review");
    // The approver signs what they read; content changed since (withdraw, edit, resubmit) is not what they saw.
    if (input.contentHash !== rev.contentHash) {
      throw new AppError(
        "conflict",
        "hash_mismatch",
        `revision ${n} changed since you read it: you saw ${input.contentHash.slice(0, 12)}…, it is now ${rev.contentHash.slice(0, 12)}…; reopen it and read it again`,
        { contentHash: `current is ${rev.contentHash}` },
      );
    }
    const already = (await repo.decisionsOf(tx, [rev.id])).some(
      (d) => d.d.round === rev.round && d.d.approverId === actor.id,
    );
    if (already) throw new Conflict("you already decided on this revision", { decision: "already recorded" });
    // The signed time is the stored one (timestamptz keeps microseconds, a JS Date milliseconds: it round-trips).
    const at = new Date();
    const key = signingKey(deps.config.signingKeyFile);
    const signature = signPayload(key, {
      planId,
      revision: n,
      contentHash: rev.contentHash,
      approverId: actor.id,
      decision: input.decision,
      round: rev.round,
      time: at.toISOString(),
    });
    await repo.insertDecision(tx, {
      revisionId: rev.id,
      round: rev.round,
      approverId: actor.id,
      decision: input.decision,
      comment: input.comment,
      signedHash: rev.contentHash,
      at,
      signature,
      keyId: key.keyId,
    });
    await recordAudit(tx, {
      actorId: actor.id,
      action: input.decision === "approve" ? "decision.approved" : "decision.changes_requested",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, signedHash: rev.contentHash, comment: input.comment, round: rev.round, keyId: key.keyId },
    });
    const author = (await repo.userRef(tx, rev.authorId))!;
    if (input.decision === "request_changes") {
      const row = await repo.updateRevision(tx, rev.id, { state: "changes_requested", decidedAt: new Date() });
      await recordAudit(tx, {
        actorId: actor.id,
        action: "revision.changes_requested",
        subjectType: "plan",
        subjectId: planId,
        detail: { revision: n },
      });
      await notify(deps, tx, "changes_requested", [author.email], {
        plan,
        revision: row,
        actorName: actor.name,
        comment: input.comment,
      });
      return { number: n, state: row.state, approvals: await repo.approvalsInRound(tx, rev.id, rev.round) };
    }
    const approvals = await repo.approvalsInRound(tx, rev.id, rev.round);
    const required = await effectiveApprovals(tx, plan);
    if (approvals < required) return { number: n, state: rev.state, approvals };
    // The previous sign-off steps down first: a plan holds one approved revision at a time, and the database
    // refuses a second (unique index plan_revisions_one_approved, migration 0022), checked statement by statement.
    const superseded = await repo.supersedeApprovedExcept(tx, planId, rev.id);
    const row = await repo.updateRevision(tx, rev.id, { state: "approved", decidedAt: new Date() });
    await repo.touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "revision.approved",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, hash: row.contentHash, approvals },
    });
    for (const s of superseded) {
      await recordAudit(tx, {
        actorId: actor.id,
        action: "revision.superseded",
        subjectType: "plan",
        subjectId: planId,
        detail: { revision: s.number, by: n },
      });
    }
    await notify(deps, tx, "approved", [author.email], {
      plan,
      revision: row,
      actorName: actor.name,
      comment: input.comment,
    });
    const infra = await repo.activeUsersWithRole(tx, "infra");
    await notify(
      deps,
      tx,
      "ready",
      infra.map((u) => u.email),
      { plan, revision: row, actorName: actor.name },
    );
    return { number: n, state: row.state, approvals };
  });
}
