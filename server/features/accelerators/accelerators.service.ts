import { asc, eq, sql } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { accelerators, planRevisions, plans } from "../../db/schema";
import { Conflict, NotFound } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import type { SessionUser } from "../../../shared/schemas";
import type { AcceleratorInput, AcceleratorUpdate } from "../../../shared/schemas/budget";
import { isUniqueViolation } from "../../db/errors";

type Row = typeof accelerators.$inferSelect;
const view = (r: Row) => ({
  id: r.id,
  name: r.name,
  memoryBytes: r.memoryBytes,
  peakFlops: r.peakFlops,
  pricePerHour: r.pricePerHour,
  notes: r.notes,
  retiredAt: r.retiredAt?.toISOString() ?? null,
});
const taken = () => new Conflict("an accelerator with this name exists", { name: "already taken" });

export const listAccelerators = async (deps: AppDeps) =>
  (await deps.db.select().from(accelerators).orderBy(asc(accelerators.name))).map(view);

export async function findAccelerator(ex: Executor, id: number) {
  const [row] = await ex.select().from(accelerators).where(eq(accelerators.id, id)).limit(1);
  return row ? view(row) : undefined;
}

export async function createAccelerator(deps: AppDeps, actor: SessionUser, input: AcceleratorInput) {
  try {
    return await deps.db.transaction(async (tx) => {
      const [row] = await tx
        .insert(accelerators)
        .values({ ...input, notes: input.notes ?? "", createdBy: actor.id })
        .returning();
      await recordAudit(tx, {
        actorId: actor.id,
        action: "accelerator.created",
        subjectType: "accelerator",
        subjectId: row.id,
        detail: view(row),
      });
      return view(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw taken();
    throw e;
  }
}

export async function updateAccelerator(deps: AppDeps, actor: SessionUser, id: number, input: AcceleratorUpdate) {
  try {
    return await deps.db.transaction(async (tx) => {
      const before = await findAccelerator(tx, id);
      if (!before) throw new NotFound("no such accelerator");
      const [row] = await tx
        .update(accelerators)
        .set({ ...input, updatedAt: new Date() })
        .where(eq(accelerators.id, id))
        .returning();
      await recordAudit(tx, {
        actorId: actor.id,
        action: "accelerator.updated",
        subjectType: "accelerator",
        subjectId: id,
        detail: { before, after: view(row) },
      });
      return view(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw taken();
    throw e;
  }
}

/** Plans with any revision costed on the accelerator (the id a budget sheet stores in content.budget.inputs.cluster). */
export async function acceleratorUsage(ex: Executor, id: number) {
  const path = sql`${planRevisions.content} #>> '{budget,inputs,cluster,acceleratorId}'`;
  return ex
    .selectDistinct({ id: plans.id, title: plans.title })
    .from(planRevisions)
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .where(sql`${path} = ${String(id)}`)
    .orderBy(asc(plans.id));
}

async function setRetired(
  tx: Executor,
  actor: SessionUser,
  id: number,
  retired: boolean,
  usedBy: { id: number; title: string }[] = [],
) {
  const [row] = await tx
    .update(accelerators)
    .set({ retiredAt: retired ? new Date() : null, updatedAt: new Date() })
    .where(eq(accelerators.id, id))
    .returning();
  await recordAudit(tx, {
    actorId: actor.id,
    action: retired ? "accelerator.retired" : "accelerator.restored",
    subjectType: "accelerator",
    subjectId: id,
    detail: { name: row.name, ...(retired ? { usedBy: usedBy.map((p) => p.id) } : {}) },
  });
  return view(row);
}

async function mustLock(tx: Executor, id: number) {
  const [row] = await tx.select().from(accelerators).where(eq(accelerators.id, id)).for("update");
  if (!row) throw new NotFound("no such accelerator");
  return row;
}

/**
 * Deletes an accelerator no plan was costed on. One that plans use is retired instead: it leaves the pickers, but
 * their budgets, new drafts from them and estimator links keep its numbers.
 */
export async function deleteAccelerator(deps: AppDeps, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const before = view(await mustLock(tx, id));
    const usedBy = await acceleratorUsage(tx, id);
    if (usedBy.length) {
      const accelerator = before.retiredAt ? before : await setRetired(tx, actor, id, true, usedBy);
      return { deleted: false as const, accelerator, usedBy };
    }
    await tx.delete(accelerators).where(eq(accelerators.id, id));
    await recordAudit(tx, {
      actorId: actor.id,
      action: "accelerator.deleted",
      subjectType: "accelerator",
      subjectId: id,
      detail: before,
    });
    return { deleted: true as const };
  });
}

/** Takes an accelerator out of the pickers (used or not); nothing that refers to it changes. */
export async function retireAccelerator(deps: AppDeps, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const row = await mustLock(tx, id);
    if (row.retiredAt) throw new Conflict(`${row.name} is already retired`, { id: "already retired" });
    return setRetired(tx, actor, id, true, await acceleratorUsage(tx, id));
  });
}

export async function restoreAccelerator(deps: AppDeps, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const row = await mustLock(tx, id);
    if (!row.retiredAt) throw new Conflict(`${row.name} is not retired`, { id: "not retired" });
    return setRetired(tx, actor, id, false);
  });
}
