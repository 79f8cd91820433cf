import { asc, eq } from "drizzle-orm";
import { modelProfiles } from "../../db/schema";
import type { Executor } from "../../db/client";

export type ModelRow = typeof modelProfiles.$inferSelect;
export type ModelInsert = typeof modelProfiles.$inferInsert;

export const listModelRows = (ex: Executor) => ex.select().from(modelProfiles).orderBy(asc(modelProfiles.name));

export const findModelRow = async (ex: Executor, id: number) =>
  (await ex.select().from(modelProfiles).where(eq(modelProfiles.id, id)).limit(1))[0];

export const lockModelRow = async (ex: Executor, id: number) =>
  (await ex.select().from(modelProfiles).where(eq(modelProfiles.id, id)).for("update"))[0];

export async function insertModelRow(ex: Executor, v: ModelInsert) {
  const [row] = await ex.insert(modelProfiles).values(v).returning();
  return row;
}

export async function updateModelRow(ex: Executor, id: number, v: Partial<ModelInsert>) {
  const [row] = await ex
    .update(modelProfiles)
    .set({ ...v, updatedAt: new Date() })
    .where(eq(modelProfiles.id, id))
    .returning();
  return row;
}

export async function deleteModelRow(ex: Executor, id: number) {
  await ex.delete(modelProfiles).where(eq(modelProfiles.id, id));
}

/**
 * Plans that use a profile (title and id). The plans feature answers it; models cannot import plans (plans build on
 * models), so the query is handed in explicitly by the app that wires both (server/app.ts) instead of registered.
 */
export type ModelUsage = (ex: Executor, modelId: number) => Promise<{ id: number; title: string }[]>;
