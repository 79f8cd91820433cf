import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { Conflict, Forbidden, Invalid, NotFound } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import { findModelRow } from "../models";
import {
  revisionInputSchema,
  type CreatePlanRequest,
  type RevisionValues,
  type SessionUser,
  type planListQuerySchema,
} from "../../../shared/schemas";
import type { z } from "zod";
import * as repo from "./plans.repo";
import { listPlansCounted } from "./plans.list";
import {
  buildContent,
  fingerprintContent,
  fingerprintOfRow,
  hashContent,
  snapshotOf,
  type ModelSnapshot,
  type RevisionContent,
} from "./revision-content";
import { budgetPart, keptAcceleratorOf, refuseRetiredAccelerator } from "./budget-part";
import { signatureStatus, signingKey } from "./signing";
import { decisionPayload } from "./integrity";
import { adoptedBaseSupport, adoptedBaseSupportOfRow } from "./base-support";
import { effectiveRequiredApprovals, latestApproved } from "../../../shared/plan-rules";
import { revisionBlockCautions } from "./export-target";

/** Engine results and budget figures for revision values; what gets hashed. */
export async function makeContent(
  ex: Executor,
  model: ModelSnapshot,
  values: RevisionValues,
): Promise<RevisionContent> {
  const content = buildContent(model, values);
  const budget = await budgetPart(ex, model, values);
  if (budget) content.budget = budget;
  else delete content.budget;
  return content;
}

export async function effectiveApprovals(ex: Executor, plan: repo.PlanRow) {
  return effectiveRequiredApprovals(plan.requiredApprovals, await repo.minRequiredApprovals(ex));
}

export async function mustPlan(ex: Executor, id: number) {
  const plan = await repo.findPlan(ex, id);
  if (!plan) throw new NotFound("no such plan");
  return plan;
}
export async function mustRevision(ex: Executor, planId: number, n: number, lock = false) {
  const rev = lock ? await repo.lockRevision(ex, planId, n) : await repo.findRevision(ex, planId, n);
  if (!rev) throw new NotFound(`plan ${planId} has no revision ${n}`);
  return rev;
}

export const revisionValues = (c: RevisionContent): RevisionValues => ({
  targetContext: c.targetContext,
  method: c.method,
  ...(c.extendsFrom ? { extendsFrom: c.extendsFrom } : {}),
  ...(c.groupMethods ? { groupMethods: c.groupMethods } : {}),
  bands: c.bands,
  stages: c.stages,
  acceptance: c.acceptance,
  notes: c.notes,
  ...(c.budget ? { budget: (c.budget as { inputs: RevisionValues["budget"] }).inputs } : {}),
});

export async function createPlan(
  deps: AppDeps,
  actor: SessionUser,
  input: z.output<typeof import("../../../shared/schemas").createPlanRequestSchema>,
) {
  const model = await findModelRow(deps.db, input.modelId);
  if (!model) throw new Invalid("no such model profile", { modelId: "not found" });
  if (model.retiredAt)
    throw new Invalid(`${model.name} is retired; pick another model profile`, { modelId: "retired" });
  await refuseRetiredAccelerator(deps.db, input.revision.budget, "choose");
  const content = await makeContent(deps.db, snapshotOf(model), input.revision);
  return deps.db.transaction(async (tx) => {
    const min = await repo.minRequiredApprovals(tx);
    const required = input.requiredApprovals ?? min;
    if (required < min)
      throw new Invalid(`the lab requires at least ${min} approvals`, { requiredApprovals: `at least ${min}` });
    const plan = await repo.insertPlan(tx, {
      title: input.title,
      purpose: input.purpose,
      ownerId: actor.id,
      modelId: model.id,
      requiredApprovals: required,
    });
    const rev = await repo.insertRevision(tx, {
      planId: plan.id,
      number: 1,
      authorId: actor.id,
      content,
      contentHash: hashContent(content),
      rotaryFingerprint: fingerprintContent(content),
      baseSupport: adoptedBaseSupport(content),
      engineVersion: content.engineVersion,
    });
    await recordAudit(tx, {
      actorId: actor.id,
      action: "plan.created",
      subjectType: "plan",
      subjectId: plan.id,
      detail: { title: plan.title, revision: 1, hash: rev.contentHash },
    });
    return { id: plan.id, revision: rev.number };
  });
}
export type { CreatePlanRequest };

/** A new draft from the latest revision, once that one is no longer a draft or in review. */
export async function newRevision(deps: AppDeps, actor: SessionUser, planId: number) {
  return deps.db.transaction(async (tx) => {
    const plan = await repo.lockPlan(tx, planId);
    if (!plan) throw new NotFound("no such plan");
    if (plan.ownerId !== actor.id) throw new Forbidden("only the plan's owner starts new revisions");
    const latest = (await repo.latestRevision(tx, planId))!;
    if (latest.state === "draft" || latest.state === "in_review") {
      throw new Conflict(`revision ${latest.number} is ${latest.state}; finish it first`, { state: latest.state });
    }
    const model = await findModelRow(tx, plan.modelId);
    if (!model) throw new Conflict("the plan's model profile is gone");
    // The new draft takes the latest content and the profile as it is now.
    const content = await makeContent(tx, snapshotOf(model), revisionValues(latest.content as RevisionContent));
    const rev = await repo.insertRevision(tx, {
      planId,
      number: latest.number + 1,
      authorId: actor.id,
      content,
      contentHash: hashContent(content),
      rotaryFingerprint: fingerprintContent(content),
      baseSupport: adoptedBaseSupport(content),
      engineVersion: content.engineVersion,
    });
    await repo.touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "revision.created",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: rev.number, from: latest.number },
    });
    return { number: rev.number, version: rev.version };
  });
}

/** Edits a draft with optimistic concurrency: a stale version changes nothing. */
export async function updateDraft(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number,
  input: z.output<typeof import("../../../shared/schemas").updateRevisionRequestSchema>,
) {
  return deps.db.transaction(async (tx) => {
    const rev = await mustRevision(tx, planId, n, true);
    if (rev.authorId !== actor.id) throw new Forbidden("only the revision's author edits a draft");
    if (rev.state !== "draft")
      throw new Conflict(`revision ${n} is ${rev.state}; only drafts change`, { state: rev.state });
    if (rev.version !== input.version) {
      throw new Conflict(
        `revision ${n} changed since you read it (version ${rev.version}, yours ${input.version}); reload`,
        { version: `current is ${rev.version}` },
      );
    }
    const old = rev.content as RevisionContent;
    const { version: _v, ...changes } = input;
    const merged: Record<string, unknown> = { ...revisionValues(old), ...changes };
    if (changes.budget === null) delete merged.budget;
    const values = revisionInputSchema.parse(merged);
    await refuseRetiredAccelerator(tx, values.budget, "choose", keptAcceleratorOf(old.budget?.inputs));
    const content = await makeContent(tx, old.model, values);
    const row = await repo.updateRevision(tx, rev.id, {
      content,
      contentHash: hashContent(content),
      rotaryFingerprint: fingerprintContent(content),
      baseSupport: adoptedBaseSupport(content),
      engineVersion: content.engineVersion,
      version: rev.version + 1,
    });
    await repo.touchPlan(tx, planId);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "revision.edited",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, version: row.version, fields: Object.keys(changes) },
    });
    return { number: n, version: row.version, contentHash: row.contentHash };
  });
}

export async function updatePlanSettings(deps: AppDeps, actor: SessionUser, min: number) {
  await deps.db.transaction(async (tx) => {
    const before = await repo.minRequiredApprovals(tx);
    await repo.setMinRequiredApprovals(tx, min, actor.id);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "settings.changed",
      subjectType: "settings",
      subjectId: "minRequiredApprovals",
      detail: { from: before, to: min },
    });
  });
  return { minRequiredApprovals: min };
}

export async function listPlans(deps: AppDeps, q: z.output<typeof planListQuerySchema>) {
  const { rows, count, nextAfter, prevBefore } = await listPlansCounted(deps.db, q);
  return {
    ...count,
    nextAfter,
    prevBefore,
    page: q.page,
    pageSize: q.pageSize,
    plans: rows.map((r) => ({
      id: r.id,
      title: r.title,
      purpose: r.purpose,
      owner: { id: r.owner_id, name: r.owner_name },
      model: { id: r.model_id, name: r.model_name },
      requiredApprovals: r.required_approvals,
      state: r.latest_state,
      latestRevision: r.latest_number,
      approvedRevision: r.approved_number,
      proof: r.approved_proof,
      createdAt: new Date(r.created_at).toISOString(),
      updatedAt: new Date(r.updated_at).toISOString(),
    })),
  };
}

/** Creates the plan and answers it as GET /api/plans/:id would. */
export async function createPlanDetail(
  deps: AppDeps,
  actor: SessionUser,
  input: z.output<typeof import("../../../shared/schemas").createPlanRequestSchema>,
) {
  const created = await createPlan(deps, actor, input);
  return getPlan(deps, created.id);
}

export async function getPlan(deps: AppDeps, id: number) {
  const plan = await mustPlan(deps.db, id);
  const [owner, model, revs, required] = await Promise.all([
    repo.userRef(deps.db, plan.ownerId),
    findModelRow(deps.db, plan.modelId),
    repo.revisionsOf(deps.db, id),
    effectiveApprovals(deps.db, plan),
  ]);
  const decisions = await repo.decisionsOf(
    deps.db,
    revs.map((r) => r.id),
  );
  const authorIds = [...new Set(revs.map((r) => r.authorId))];
  const authors = new Map(await Promise.all(authorIds.map(async (a) => [a, await repo.userRef(deps.db, a)] as const)));
  const key = signingKey(deps.config.signingKeyFile);
  const latest = revs[revs.length - 1];
  const approved = latestApproved(revs);
  return {
    id: plan.id,
    title: plan.title,
    purpose: plan.purpose,
    owner,
    model: model ? { id: model.id, name: model.name } : null,
    requiredApprovals: plan.requiredApprovals,
    effectiveRequiredApprovals: required,
    state: latest.state,
    latestRevision: latest.number,
    approvedRevision: approved?.number ?? null,
    createdAt: plan.createdAt.toISOString(),
    updatedAt: plan.updatedAt.toISOString(),
    revisions: revs.map((r) => {
      const mine = decisions.filter((d) => d.d.revisionId === r.id);
      return {
        number: r.number,
        state: r.state,
        version: r.version,
        round: r.round,
        contentHash: r.contentHash,
        engineVersion: r.engineVersion,
        rotaryFingerprint: r.rotaryFingerprint,
        author: authors.get(r.authorId),
        createdAt: r.createdAt.toISOString(),
        submittedAt: r.submittedAt?.toISOString() ?? null,
        decidedAt: r.decidedAt?.toISOString() ?? null,
        approvals: mine.filter((d) => d.d.round === r.round && d.d.decision === "approve").length,
        decisions: mine.map((d) => ({
          approver: { id: d.d.approverId, name: d.name, email: d.email },
          decision: d.d.decision,
          comment: d.d.comment,
          signedHash: d.d.signedHash,
          round: d.d.round,
          at: d.d.at.toISOString(),
          keyId: d.d.keyId,
          signatureStatus: signatureStatus(key, decisionPayload(id, r.number, d.d), d.d.signature, d.d.keyId),
        })),
      };
    }),
  };
}

export async function getRevision(deps: AppDeps, planId: number, n: number) {
  const plan = await mustPlan(deps.db, planId);
  const r = await mustRevision(deps.db, planId, n);
  return {
    number: r.number,
    state: r.state,
    version: r.version,
    round: r.round,
    contentHash: r.contentHash,
    engineVersion: r.engineVersion,
    rotaryFingerprint: fingerprintOfRow(r),
    authorId: r.authorId,
    content: r.content as RevisionContent,
    adoptedBases: adoptedBaseSupportOfRow(r),
    blockCautions: await revisionBlockCautions(deps, plan.modelId, r.content as RevisionContent),
  };
}

/** The organisation-wide floor on approvals per plan (routers read it here, not from the repo). */
export const minRequiredApprovals = (deps: AppDeps) => repo.minRequiredApprovals(deps.db);
