import { eq } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { settings } from "../../db/schema";
import { recordAudit } from "../../platform/audit";
import type { SessionUser } from "../../../shared/schemas";

/*
 * The workspace currency: one ISO 4217 code every price per accelerator-hour and every cost is in. Stored in the
 * settings table (key "currency"; a CHECK keeps it three capital letters); migration 0016 seeds "USD".
 */
const KEY = "currency";
/** Used only if the seeded row were missing: the migration writes the same value. */
export const FALLBACK_CURRENCY = "USD";

export async function workspaceCurrency(ex: Executor): Promise<string> {
  const [row] = await ex.select().from(settings).where(eq(settings.key, KEY)).limit(1);
  return typeof row?.value === "string" ? row.value : FALLBACK_CURRENCY;
}

/** Admin only (the route checks the role); recorded in the audit trail in the same transaction. */
export async function setWorkspaceCurrency(deps: AppDeps, actor: SessionUser, currency: string) {
  await deps.db.transaction(async (tx) => {
    const [before] = await tx.select().from(settings).where(eq(settings.key, KEY)).for("update");
    await tx
      .insert(settings)
      .values({ key: KEY, value: currency, updatedBy: actor.id })
      .onConflictDoUpdate({
        target: settings.key,
        set: { value: currency, updatedBy: actor.id, updatedAt: new Date() },
      });
    await recordAudit(tx, {
      actorId: actor.id,
      action: "settings.changed",
      subjectType: "settings",
      subjectId: KEY,
      detail: { from: typeof before?.value === "string" ? before.value : null, to: currency },
    });
  });
  return { currency };
}
