import { eq, isNull, or, sql } from "drizzle-orm";
import { planFingerprint } from "../engine/fingerprint";
import { rotaryShapeOf } from "../../shared/profile-shapes";
import { groupRotarySpecs } from "../../shared/layer-groups";
import type { RevisionContent } from "../../shared/schemas/plans";
import type { Db } from "./client";
import { planRevisions } from "./schema";

/**
 * Revisions written before plan_revisions.rotary_fingerprint existed get theirs computed from their stored content
 * (frozen model snapshot, target length, method). Layered revisions are recomputed too: before the fingerprint covered
 * every layer group, theirs hashed the scaled group alone. Only the column is written: content and content_hash stay
 * as they are, so every old revision still verifies. Runs after migrations, as the owner; a no-op once all agree.
 */
export async function backfillFingerprints(db: Db): Promise<number> {
  const rows = await db
    .select({ id: planRevisions.id, content: planRevisions.content, stored: planRevisions.rotaryFingerprint })
    .from(planRevisions)
    .where(or(isNull(planRevisions.rotaryFingerprint), sql`${planRevisions.content}->'model' ? 'layerGroups'`));
  let written = 0;
  for (const row of rows) {
    const c = row.content as RevisionContent;
    const groups = groupRotarySpecs(c.model, c.method, c.groupMethods);
    const fingerprint = planFingerprint(rotaryShapeOf(c.model), c.targetContext, c.method, groups);
    if (fingerprint === row.stored) continue;
    await db.update(planRevisions).set({ rotaryFingerprint: fingerprint }).where(eq(planRevisions.id, row.id));
    written++;
  }
  return written;
}
