import { asc, eq } from "drizzle-orm";
import { conformanceChecks, planRevisions, users } from "../../db/schema";
import type { Executor } from "../../db/client";

export const insertCheck = async (ex: Executor, v: typeof conformanceChecks.$inferInsert) =>
  (await ex.insert(conformanceChecks).values(v).returning({ id: conformanceChecks.id }))[0].id;

/** Every check on a plan's revisions, oldest first, with the revision number and who uploaded it. */
export const checksOfPlan = (ex: Executor, planId: number) =>
  ex
    .select({ check: conformanceChecks, revision: planRevisions.number, byName: users.name })
    .from(conformanceChecks)
    .innerJoin(planRevisions, eq(planRevisions.id, conformanceChecks.revisionId))
    .innerJoin(users, eq(users.id, conformanceChecks.byUserId))
    .where(eq(conformanceChecks.planId, planId))
    .orderBy(asc(conformanceChecks.createdAt), asc(conformanceChecks.id));
