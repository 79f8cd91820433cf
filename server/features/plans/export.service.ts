import type { AppDeps } from "../../deps";
import { Conflict } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import type { SessionUser } from "../../../shared/schemas";
import * as repo from "./plans.repo";
import { getPlan, mustPlan, mustRevision } from "./plans.service";
import { renderReport } from "./report";
import { budgetSection } from "./report-budget";
import type { RevisionContent } from "./revision-content";
import { checkRevision } from "./integrity";
import { signingKey } from "./signing";
import { checkedProofs } from "./proofs";
import { blockCautions, modelFile, targetBlock, type ExportChoice } from "./export-target";
import { layeredExport } from "./group-export";
import { adoptedBaseSupportOfRow } from "./base-support";
import { isSigned, latestApproved } from "../../../shared/plan-rules";
import { lineageOf, startLength } from "../../../shared/lineage";

/** A plan on an already-scaled model says which length it extends from, and where this block's stage starts. */
function lineagePart(content: RevisionContent, stage: number | undefined) {
  const l = lineageOf(content.model);
  if (!l) return {};
  const from = content.extendsFrom ?? "pretrained";
  // Stage n is exported for a checkpoint that finished stage n − 1: it starts at that stage's target.
  const start = stage !== undefined && stage > 1 ? content.stages[stage - 2].targetContext : startLength(l, from);
  return { extendsFrom: from, startContext: start };
}

export const EXPORT_CAUTION =
  "Estimates, not guarantees: this patch is what was signed; the extension is confirmed only by long-context evaluations of the tuned model.";

const check = async (deps: AppDeps, planId: number, rev: repo.RevisionRow) =>
  checkRevision(signingKey(deps.config.signingKeyFile), planId, rev, await repo.decisionsOf(deps.db, [rev.id]));

/** Recomputes the content hash and checks every decision's signed hash and signature (integrity.ts). */
export async function verifyRevision(deps: AppDeps, planId: number, n: number) {
  await mustPlan(deps.db, planId);
  const rev = await mustRevision(deps.db, planId, n);
  const c = await check(deps, planId, rev);
  return {
    number: n,
    ok: c.ok,
    storedHash: rev.contentHash,
    computedHash: c.computedHash,
    engineVersion: rev.engineVersion,
    hashIntact: c.hashIntact,
    keyId: c.keyId,
    problems: c.problems,
    decisions: c.decisions.map((d) => ({
      approver: d.approver,
      decision: d.decision,
      round: d.round,
      signedHash: d.signedHash,
      at: d.at,
      keyId: d.keyId,
      signatureStatus: d.signatureStatus,
    })),
  };
}

/** The signed configuration patch; refused (409) when any integrity check fails. */
export async function exportRevision(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number | "approved",
  via: "session" | "token",
  choice: ExportChoice = {},
) {
  const plan = await mustPlan(deps.db, planId);
  let number: number;
  if (n === "approved") {
    const approved = latestApproved(await repo.revisionsOf(deps.db, planId));
    if (!approved) throw new Conflict("this plan has no approved revision yet", { state: "no approved revision" });
    number = approved.number;
  } else number = n;
  const rev = await mustRevision(deps.db, planId, number);
  if (!isSigned(rev.state)) {
    throw new Conflict(`revision ${number} is ${rev.state}; only signed revisions export`, { state: rev.state });
  }
  const c = await check(deps, planId, rev);
  if (!c.ok) {
    throw new Conflict(
      `revision ${number} fails its integrity check (${c.problems.join("; ")}); export refused`,
      c.hashIntact ? { signatures: "do not hold" } : { contentHash: "mismatch" },
    );
  }
  const content = rev.content as RevisionContent;
  const decisions = c.decisions.filter((d) => d.decision === "approve" && d.round === rev.round);
  // the block and its cautions may both need the model's file: one read serves both
  const file = modelFile(deps, plan.modelId);
  const [block, cautions] = await Promise.all([
    targetBlock(file, content, choice),
    blockCautions(file, content, choice.stage),
  ]);
  await recordAudit(deps.db, {
    actorId: actor.id,
    action: "revision.exported",
    subjectType: "plan",
    subjectId: planId,
    detail: {
      revision: number,
      via,
      hash: rev.contentHash,
      target: choice.target ?? null,
      stage: choice.stage ?? null,
    },
  });
  return {
    plan: { id: plan.id, title: plan.title },
    revision: number,
    state: rev.state,
    contentHash: rev.contentHash,
    engineVersion: rev.engineVersion,
    model: {
      name: content.model.name,
      trainedContext: content.model.trainedContext,
      ropeTheta: content.model.ropeTheta,
    },
    ...lineagePart(content, choice.stage),
    targetContext: block.targetContext,
    method: block.method,
    config: block.config,
    attentionFactor: block.attentionFactor,
    stage: choice.stage ?? null,
    fingerprint: block.fingerprint,
    ...(block.target ? { target: block.target } : {}),
    ...layeredExport(content),
    keyId: c.keyId,
    // Each signature covers the RFC 8785 canonical JSON of its payload; README "Verifying an export offline".
    signedBy: decisions.map((d) => ({
      name: d.approver.name,
      email: d.approver.email,
      signedHash: d.signedHash,
      at: d.at,
      keyId: d.keyId!,
      signature: d.signature!,
      payload: d.payload,
    })),
    caution: EXPORT_CAUTION,
    ...(cautions.length ? { cautions } : {}),
  };
}

/** The printable report of one revision; its integrity line comes from the same checks as verify and export. */
export async function revisionReport(deps: AppDeps, planId: number, n: number) {
  const [plan, rev] = await Promise.all([getPlan(deps, planId), mustRevision(deps.db, planId, n)]);
  const content = rev.content as RevisionContent;
  const [c, proofs] = await Promise.all([
    check(deps, planId, rev),
    checkedProofs(deps.db, signingKey(deps.config.signingKeyFile), planId, n, rev.id),
  ]);
  return renderReport({
    plan: { id: planId, title: plan.title, purpose: plan.purpose, owner: plan.owner ?? undefined },
    revision: rev,
    content,
    verified: c.ok,
    problems: c.problems,
    decisions: plan.revisions.find((x) => x.number === n)?.decisions ?? [],
    budgetHtml: budgetSection(content),
    proof: { state: rev.proof ?? null, decisions: proofs },
    adoptedBases: adoptedBaseSupportOfRow(rev),
  });
}
