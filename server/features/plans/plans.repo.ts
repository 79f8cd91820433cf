import { and, asc, desc, eq, getTableColumns, sql } from "drizzle-orm";
import { planDecisions, planRevisions, plans, settings, users } from "../../db/schema";
import type { Executor } from "../../db/client";

export type PlanRow = typeof plans.$inferSelect;
export type RevisionRow = typeof planRevisions.$inferSelect;
export type DecisionRow = typeof planDecisions.$inferSelect;

export const findPlan = async (ex: Executor, id: number) =>
  (await ex.select().from(plans).where(eq(plans.id, id)).limit(1))[0];
export const lockPlan = async (ex: Executor, id: number) =>
  (await ex.select().from(plans).where(eq(plans.id, id)).for("update").limit(1))[0];

/** Every column of a revision but its content, which the plan page does not show (it can be tens of kB each). */
const { content: _content, ...revisionHead } = getTableColumns(planRevisions);
export type RevisionHead = Omit<RevisionRow, "content">;

export const revisionsOf = (ex: Executor, planId: number): Promise<RevisionHead[]> =>
  ex
    .select(revisionHead)
    .from(planRevisions)
    .where(eq(planRevisions.planId, planId))
    .orderBy(asc(planRevisions.number));

export const findRevision = async (ex: Executor, planId: number, n: number) =>
  (
    await ex
      .select()
      .from(planRevisions)
      .where(and(eq(planRevisions.planId, planId), eq(planRevisions.number, n)))
      .limit(1)
  )[0];

/** The row lock every transition takes first, so decisions, edits and withdrawals serialise. */
export const lockRevision = async (ex: Executor, planId: number, n: number) =>
  (
    await ex
      .select()
      .from(planRevisions)
      .where(and(eq(planRevisions.planId, planId), eq(planRevisions.number, n)))
      .for("update")
      .limit(1)
  )[0];

export const latestRevision = async (ex: Executor, planId: number) =>
  (
    await ex
      .select()
      .from(planRevisions)
      .where(eq(planRevisions.planId, planId))
      .orderBy(desc(planRevisions.number))
      .limit(1)
  )[0];

export async function insertPlan(ex: Executor, v: typeof plans.$inferInsert) {
  const [row] = await ex.insert(plans).values(v).returning();
  return row;
}
export async function insertRevision(ex: Executor, v: typeof planRevisions.$inferInsert) {
  const [row] = await ex.insert(planRevisions).values(v).returning();
  return row;
}
export async function updateRevision(ex: Executor, id: number, v: Partial<typeof planRevisions.$inferInsert>) {
  const [row] = await ex
    .update(planRevisions)
    .set({ ...v, updatedAt: new Date() })
    .where(eq(planRevisions.id, id))
    .returning();
  return row;
}
export const touchPlan = (ex: Executor, id: number) =>
  ex.update(plans).set({ updatedAt: new Date() }).where(eq(plans.id, id));

export const decisionsOf = (ex: Executor, revisionIds: number[]) =>
  revisionIds.length
    ? ex
        .select({ d: planDecisions, name: users.name, email: users.email })
        .from(planDecisions)
        .innerJoin(users, eq(users.id, planDecisions.approverId))
        .where(sql`${planDecisions.revisionId} IN ${revisionIds}`)
        .orderBy(asc(planDecisions.at), asc(planDecisions.id))
    : Promise.resolve([]);

/** A revision of the plan sent back for changes on exactly this content, if any (the latest such). */
export const sentBackWithHash = async (ex: Executor, planId: number, hash: string) =>
  (
    await ex
      .select({ number: planRevisions.number, round: planDecisions.round })
      .from(planDecisions)
      .innerJoin(planRevisions, eq(planRevisions.id, planDecisions.revisionId))
      .where(
        and(
          eq(planRevisions.planId, planId),
          eq(planDecisions.decision, "request_changes"),
          eq(planDecisions.signedHash, hash),
        ),
      )
      .orderBy(desc(planDecisions.at))
      .limit(1)
  )[0];

export async function insertDecision(ex: Executor, v: typeof planDecisions.$inferInsert) {
  const [row] = await ex.insert(planDecisions).values(v).returning();
  return row;
}

export async function approvalsInRound(ex: Executor, revisionId: number, round: number) {
  const [r] = await ex
    .select({ n: sql<number>`count(*)::int` })
    .from(planDecisions)
    .where(
      and(
        eq(planDecisions.revisionId, revisionId),
        eq(planDecisions.round, round),
        eq(planDecisions.decision, "approve"),
      ),
    );
  return r.n;
}

export const supersedeApprovedExcept = (ex: Executor, planId: number, keepId: number) =>
  ex
    .update(planRevisions)
    .set({ state: "superseded", updatedAt: new Date() })
    .where(
      and(eq(planRevisions.planId, planId), eq(planRevisions.state, "approved"), sql`${planRevisions.id} <> ${keepId}`),
    )
    .returning({ number: planRevisions.number });

export async function minRequiredApprovals(ex: Executor) {
  const [row] = await ex.select().from(settings).where(eq(settings.key, "minRequiredApprovals")).limit(1);
  return typeof row?.value === "number" ? row.value : 1;
}
export async function setMinRequiredApprovals(ex: Executor, value: number, by: number) {
  await ex
    .insert(settings)
    .values({ key: "minRequiredApprovals", value, updatedBy: by })
    .onConflictDoUpdate({ target: settings.key, set: { value, updatedBy: by, updatedAt: new Date() } });
}

export const activeUsersWithRole = (ex: Executor, role: string) =>
  ex
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(sql`${users.active} AND ${role} = ANY(${users.roles})`);

export const userRef = async (ex: Executor, id: number) =>
  (
    await ex.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, id)).limit(1)
  )[0];
