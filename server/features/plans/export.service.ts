import type { AppDeps } from "../../deps";
import { Conflict } from "../../http/errors";
import { recordAudit } from "../audit/audit.repo";
import type { SessionUser } from "../../../shared/schemas";
import * as repo from "./plans.repo";
import { getPlan, getRevision, mustPlan, mustRevision } from "./plans.service";
import { renderReport } from "./report";
import { budgetSection } from "./report-budget";
import { hashContent, type RevisionContent } from "./revision-content";

export const EXPORT_CAUTION =
  "Estimates, not guarantees: this patch is what was signed; the extension is confirmed only by long-context evaluations of the tuned model.";

export async function verifyRevision(deps: AppDeps, planId: number, n: number) {
  await mustPlan(deps.db, planId);
  const rev = await mustRevision(deps.db, planId, n);
  const computed = hashContent(rev.content);
  return { number: n, ok: computed === rev.contentHash, storedHash: rev.contentHash, computedHash: computed, engineVersion: rev.engineVersion };
}

/** The signed configuration patch; refused when the stored content no longer matches its hash. */
export async function exportRevision(deps: AppDeps, actor: SessionUser, planId: number, n: number | "approved", via: "session" | "token") {
  const plan = await mustPlan(deps.db, planId);
  let number: number;
  if (n === "approved") {
    const approved = (await repo.revisionsOf(deps.db, planId)).filter((r) => r.state === "approved").pop();
    if (!approved) throw new Conflict("this plan has no approved revision yet", { state: "no approved revision" });
    number = approved.number;
  } else number = n;
  const rev = await mustRevision(deps.db, planId, number);
  if (rev.state !== "approved" && rev.state !== "superseded") {
    throw new Conflict(`revision ${number} is ${rev.state}; only signed revisions export`, { state: rev.state });
  }
  const computed = hashContent(rev.content);
  if (computed !== rev.contentHash) {
    throw new Conflict(`revision ${number} fails its integrity check (stored ${rev.contentHash.slice(0, 12)}…, computed ${computed.slice(0, 12)}…); export refused`, { contentHash: "mismatch" });
  }
  const content = rev.content as RevisionContent;
  const decisions = (await repo.decisionsOf(deps.db, [rev.id])).filter((d) => d.d.decision === "approve" && d.d.round === rev.round);
  await recordAudit(deps.db, { actorId: actor.id, action: "revision.exported", subjectType: "plan", subjectId: planId, detail: { revision: number, via, hash: rev.contentHash } });
  return {
    plan: { id: plan.id, title: plan.title },
    revision: number,
    state: rev.state,
    contentHash: rev.contentHash,
    engineVersion: rev.engineVersion,
    model: { name: content.model.name, trainedContext: content.model.trainedContext, ropeTheta: content.model.ropeTheta },
    targetContext: content.targetContext,
    method: content.method,
    config: content.results.final.patch,
    attentionFactor: content.results.final.attentionFactor,
    signedBy: decisions.map((d) => ({ name: d.name, email: d.email, signedHash: d.d.signedHash, at: d.d.at.toISOString() })),
    caution: EXPORT_CAUTION,
  };
}

/** The printable report of one revision; its integrity line comes from the content it prints. */
export async function revisionReport(deps: AppDeps, planId: number, n: number) {
  const [plan, rev] = await Promise.all([getPlan(deps, planId), getRevision(deps, planId, n)]);
  const content = rev.content as RevisionContent;
  return renderReport({
    plan: { id: planId, title: plan.title, purpose: plan.purpose, owner: plan.owner ?? undefined },
    revision: rev,
    content,
    verified: hashContent(content) === rev.contentHash,
    decisions: plan.revisions.find((x) => x.number === n)?.decisions ?? [],
    budgetHtml: budgetSection(content),
  });
}
