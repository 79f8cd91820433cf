import { asc, eq, ilike, or, sql } from "drizzle-orm";
import { session, users } from "../../db/schema";
import type { Executor } from "../../db/client";
import { cappedCount, containsPattern } from "../../platform/paging";
import type { Role } from "../../../shared/schemas";

export type UserRow = typeof users.$inferSelect;

export const findUserByEmail = async (ex: Executor, email: string) =>
  (await ex.select().from(users).where(eq(users.email, email.toLowerCase())).limit(1))[0];

export const findUserById = async (ex: Executor, id: number) =>
  (await ex.select().from(users).where(eq(users.id, id)).limit(1))[0];

/** Locks the row so concurrent role changes serialise. */
export const lockUserById = async (ex: Executor, id: number) =>
  (await ex.select().from(users).where(eq(users.id, id)).for("update").limit(1))[0];

/**
 * Locks every active admin's row, always in id order so two callers cannot deadlock. Taken before any other
 * user row by changes that may remove an admin: the second of two such changes waits, then counts afresh.
 */
export async function lockActiveAdmins(ex: Executor) {
  await ex
    .select({ id: users.id })
    .from(users)
    .where(sql`${users.active} AND 'admin' = ANY(${users.roles})`)
    .orderBy(asc(users.id))
    .for("update");
}

export interface UserListQuery {
  q?: string;
  limit: number;
  offset: number;
}

// ILIKE '%…%' on the name is served by users_name_trgm; on the e-mail it scans, which stays small (people, not rows
// of work: 500 in a busy lab's year).
const userWhere = (q: UserListQuery) =>
  q.q ? or(ilike(users.name, containsPattern(q.q)), ilike(users.email, containsPattern(q.q))) : undefined;

/** One page in id order (the primary key), only the columns the list shows (no password hash). */
export const listUserPage = (ex: Executor, q: UserListQuery) =>
  ex
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      roles: users.roles,
      active: users.active,
      createdAt: users.createdAt,
    })
    .from(users)
    .where(userWhere(q))
    .orderBy(asc(users.id))
    .limit(q.limit)
    .offset(q.offset);

export const countUsers = (ex: Executor, q: UserListQuery) =>
  cappedCount(ex, sql`SELECT 1 FROM ${users} WHERE ${userWhere(q) ?? sql`true`}`);

export async function insertUser(
  ex: Executor,
  v: { email: string; name: string; passwordHash: string; roles: Role[] },
) {
  const [row] = await ex
    .insert(users)
    .values({ ...v, email: v.email.toLowerCase() })
    .returning();
  return row;
}

export async function updateUser(
  ex: Executor,
  id: number,
  v: Partial<Pick<UserRow, "name" | "roles" | "active" | "passwordHash">>,
) {
  const [row] = await ex
    .update(users)
    .set({ ...v, updatedAt: new Date() })
    .where(eq(users.id, id))
    .returning();
  return row;
}

export async function countActiveAdmins(ex: Executor) {
  const [r] = await ex
    .select({ n: sql<number>`count(*)::int` })
    .from(users)
    .where(sql`${users.active} AND 'admin' = ANY(${users.roles})`);
  return r.n;
}

/** Ends every session of a user (deactivation, password change elsewhere). */
export async function deleteSessionsOfUser(ex: Executor, userId: number, exceptSid?: string) {
  await ex.execute(
    exceptSid
      ? sql`DELETE FROM ${session} WHERE ${session.sess}->>'userId' = ${String(userId)} AND ${session.sid} <> ${exceptSid}`
      : sql`DELETE FROM ${session} WHERE ${session.sess}->>'userId' = ${String(userId)}`,
  );
}
