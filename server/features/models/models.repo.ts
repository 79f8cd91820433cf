import { and, asc, eq, getTableColumns, ilike, isNull, sql, type SQL } from "drizzle-orm";
import { modelProfiles } from "../../db/schema";
import type { Executor } from "../../db/client";
import { cappedCount, containsPattern } from "../../platform/paging";

export type ModelRow = typeof modelProfiles.$inferSelect;
export type ModelInsert = typeof modelProfiles.$inferInsert;

/** A profile as lists show it: every column but the uploaded file (up to 1 MB each), which only GET …/source sends. */
export type ModelListRow = Omit<ModelRow, "sourceConfig">;
const { sourceConfig: _file, ...listColumns } = getTableColumns(modelProfiles);

export interface ModelListQuery {
  q?: string;
  retired: "include" | "exclude";
  limit: number;
  offset: number;
}

const listWhere = (q: ModelListQuery): SQL | undefined =>
  and(
    // ILIKE '%…%' on the name is served by model_profiles_name_trgm (migration 0013).
    q.q ? ilike(modelProfiles.name, containsPattern(q.q)) : undefined,
    q.retired === "exclude" ? isNull(modelProfiles.retiredAt) : undefined,
  );

/** One page by name (model_profiles_name_lower_idx: lower(name), id), without the uploaded files. */
export const listModelPage = (ex: Executor, q: ModelListQuery): Promise<ModelListRow[]> =>
  ex
    .select(listColumns)
    .from(modelProfiles)
    .where(listWhere(q))
    .orderBy(sql`lower(${modelProfiles.name})`, asc(modelProfiles.id))
    .limit(q.limit)
    .offset(q.offset);

/** How many profiles match, counted up to a cap (see cappedCount). */
export const countModels = (ex: Executor, q: ModelListQuery) =>
  cappedCount(ex, sql`SELECT 1 FROM ${modelProfiles} WHERE ${listWhere(q) ?? sql`true`}`);

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
