import { asc, eq } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { accelerators } from "../../db/schema";
import { Conflict, NotFound } from "../../http/errors";
import { recordAudit } from "../audit/audit.repo";
import type { SessionUser } from "../../../shared/schemas";
import type { AcceleratorInput, AcceleratorUpdate } from "../../../shared/schemas/budget";
import { isUniqueViolation } from "../../db/errors";

type Row = typeof accelerators.$inferSelect;
const view = (r: Row) => ({ id: r.id, name: r.name, memoryBytes: r.memoryBytes, peakFlops: r.peakFlops, pricePerHour: r.pricePerHour, notes: r.notes });
const taken = () => new Conflict("an accelerator with this name exists", { name: "already taken" });

export const listAccelerators = async (deps: AppDeps) => (await deps.db.select().from(accelerators).orderBy(asc(accelerators.name))).map(view);

export async function findAccelerator(ex: Executor, id: number) {
  const [row] = await ex.select().from(accelerators).where(eq(accelerators.id, id)).limit(1);
  return row ? view(row) : undefined;
}

export async function createAccelerator(deps: AppDeps, actor: SessionUser, input: AcceleratorInput) {
  try {
    return await deps.db.transaction(async (tx) => {
      const [row] = await tx.insert(accelerators).values({ ...input, notes: input.notes ?? "", createdBy: actor.id }).returning();
      await recordAudit(tx, { actorId: actor.id, action: "accelerator.created", subjectType: "accelerator", subjectId: row.id, detail: view(row) });
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
      const [row] = await tx.update(accelerators).set({ ...input, updatedAt: new Date() }).where(eq(accelerators.id, id)).returning();
      await recordAudit(tx, { actorId: actor.id, action: "accelerator.updated", subjectType: "accelerator", subjectId: id, detail: { before, after: view(row) } });
      return view(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw taken();
    throw e;
  }
}

export async function deleteAccelerator(deps: AppDeps, actor: SessionUser, id: number) {
  await deps.db.transaction(async (tx) => {
    const before = await findAccelerator(tx, id);
    if (!before) throw new NotFound("no such accelerator");
    await tx.delete(accelerators).where(eq(accelerators.id, id));
    await recordAudit(tx, { actorId: actor.id, action: "accelerator.deleted", subjectType: "accelerator", subjectId: id, detail: before });
  });
}
