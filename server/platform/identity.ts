import crypto from "node:crypto";
import { and, eq, isNull, sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { apiTokens, users } from "../db/schema";
import { tokenScopeSchema, type Role, type SessionUser, type TokenScope } from "../../shared/schemas";

/*
 * Who is calling: the current-user lookups that server/http's session and bearer middleware need. They live here,
 * below the features, so server/http depends on no feature; the users and tokens features build on the same helpers.
 */

type UserRow = typeof users.$inferSelect;

export const toSessionUser = (row: Pick<UserRow, "id" | "email" | "name" | "roles">): SessionUser => ({
  id: row.id,
  email: row.email,
  name: row.name,
  roles: row.roles as Role[],
});

/**
 * The user read of every signed-in request, as a named prepared statement per database handle: drizzle builds its SQL
 * once and PostgreSQL parses and plans it once per connection, and only the columns a SessionUser needs are read
 * (docs/scale-figures.md "New questions: what repeats between them"). It still reads the row on every request.
 */
const userReads = new WeakMap<Db, ReturnType<typeof prepareUserRead>>();
const prepareUserRead = (db: Db) =>
  db
    .select({ id: users.id, email: users.email, name: users.name, roles: users.roles, active: users.active })
    .from(users)
    .where(eq(users.id, sql.placeholder("id")))
    .limit(1)
    .prepare("rw_active_session_user");

/** The signed-in user for a session's user id, or undefined when the account is gone or deactivated. */
export async function activeSessionUser(db: Db, id: number): Promise<SessionUser | undefined> {
  let read = userReads.get(db);
  if (!read) userReads.set(db, (read = prepareUserRead(db)));
  const [row] = await read.execute({ id });
  return row && row.active ? toSessionUser(row) : undefined;
}

/** Only the SHA-256 of a token secret is stored. */
export const hashTokenSecret = (secret: string) => crypto.createHash("sha256").update(secret).digest("hex");

/** Stored scopes the server still knows; an unknown one (from a newer build, say) grants nothing here. */
export const knownScopes = (stored: string[]): TokenScope[] =>
  stored.flatMap((s) => {
    const p = tokenScopeSchema.safeParse(s);
    return p.success ? [p.data] : [];
  });

/** The owner and scopes of a live token, or undefined; records when it was last used (at most once a minute). */
export async function liveToken(db: Db, secret: string) {
  const [row] = await db
    .select()
    .from(apiTokens)
    .where(and(eq(apiTokens.tokenHash, hashTokenSecret(secret)), isNull(apiTokens.revokedAt)))
    .limit(1);
  if (!row) return undefined;
  await db
    .update(apiTokens)
    .set({ lastUsedAt: new Date() })
    .where(
      and(
        eq(apiTokens.id, row.id),
        sql`(${apiTokens.lastUsedAt} IS NULL OR ${apiTokens.lastUsedAt} < now() - interval '1 minute')`,
      ),
    );
  return { userId: row.userId, scopes: knownScopes(row.scopes) };
}
