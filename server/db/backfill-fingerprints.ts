import { eq, isNull } from "drizzle-orm";
import { planFingerprint } from "../engine/fingerprint";
import { rotaryShapeOf } from "../../shared/profile-shapes";
import type { RevisionContent } from "../../shared/schemas/plans";
import type { Db } from "./client";
import { planRevisions } from "./schema";

/**
 * Revisions written before plan_revisions.rotary_fingerprint existed get theirs computed from their stored content
 * (frozen model snapshot, target length, method). Only the new column is written: content and content_hash stay as
 * they are, so every old revision still verifies. Runs after migrations, as the owner; a no-op once all are filled.
 */
export async function backfillFingerprints(db: Db): Promise<number> {
  const rows = await db
    .select({ id: planRevisions.id, content: planRevisions.content })
    .from(planRevisions)
    .where(isNull(planRevisions.rotaryFingerprint));
  for (const row of rows) {
    const c = row.content as RevisionContent;
    const fingerprint = planFingerprint(rotaryShapeOf(c.model), c.targetContext, c.method);
    await db.update(planRevisions).set({ rotaryFingerprint: fingerprint }).where(eq(planRevisions.id, row.id));
  }
  return rows.length;
}
