import crypto from "node:crypto";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { apiTokens } from "../../db/schema";
import { NotFound } from "../../http/errors";
import { recordAudit } from "../audit/audit.repo";
import { tokenScopeSchema, type SessionUser, type TokenScope } from "../../../shared/schemas";

const sha256 = (s: string) => crypto.createHash("sha256").update(s).digest("hex");

/** Stored scopes the server still knows; an unknown one (from a newer build, say) grants nothing here. */
const knownScopes = (stored: string[]): TokenScope[] => stored.flatMap((s) => {
  const p = tokenScopeSchema.safeParse(s);
  return p.success ? [p.data] : [];
});

const view = (t: typeof apiTokens.$inferSelect) => ({
  id: t.id, name: t.name, prefix: t.prefix, scopes: knownScopes(t.scopes), createdAt: t.createdAt.toISOString(),
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null, revokedAt: t.revokedAt?.toISOString() ?? null,
});

/** A personal token with the given scopes; the secret is returned once and only its SHA-256 is kept. */
export async function createToken(deps: AppDeps, actor: SessionUser, name: string, scopes: TokenScope[]) {
  const secret = `rw_${crypto.randomBytes(32).toString("base64url")}`;
  return deps.db.transaction(async (tx) => {
    const [row] = await tx.insert(apiTokens).values({ userId: actor.id, name, scopes, tokenHash: sha256(secret), prefix: secret.slice(0, 10) }).returning();
    await recordAudit(tx, { actorId: actor.id, action: "token.created", subjectType: "token", subjectId: row.id, detail: { name, scopes } });
    return { ...view(row), token: secret };
  });
}

export async function listTokens(deps: AppDeps, actor: SessionUser) {
  const rows = await deps.db.select().from(apiTokens).where(eq(apiTokens.userId, actor.id)).orderBy(desc(apiTokens.createdAt));
  return rows.map(view);
}

export async function revokeToken(deps: AppDeps, actor: SessionUser, id: number) {
  await deps.db.transaction(async (tx) => {
    const [row] = await tx.update(apiTokens).set({ revokedAt: new Date() })
      .where(and(eq(apiTokens.id, id), eq(apiTokens.userId, actor.id), isNull(apiTokens.revokedAt))).returning();
    if (!row) throw new NotFound("no such active token of yours");
    await recordAudit(tx, { actorId: actor.id, action: "token.revoked", subjectType: "token", subjectId: id, detail: { name: row.name } });
  });
}

/** The owner and scopes of a live token, or undefined; records when it was last used (at most once a minute). */
export async function liveToken(deps: AppDeps, secret: string) {
  const [row] = await deps.db.select().from(apiTokens).where(and(eq(apiTokens.tokenHash, sha256(secret)), isNull(apiTokens.revokedAt))).limit(1);
  if (!row) return undefined;
  await deps.db.update(apiTokens).set({ lastUsedAt: new Date() })
    .where(and(eq(apiTokens.id, row.id), sql`(${apiTokens.lastUsedAt} IS NULL OR ${apiTokens.lastUsedAt} < now() - interval '1 minute')`));
  return { userId: row.userId, scopes: knownScopes(row.scopes) };
}

/**
 * Revokes every live token of a user (password change, deactivation). Revoked stays revoked: reactivating the
 * account does not bring a token back. Returns how many were revoked, for the caller's audit entry.
 */
export async function revokeAllTokensOfUser(ex: Executor, userId: number) {
  const rows = await ex.update(apiTokens).set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt))).returning({ id: apiTokens.id });
  return rows.length;
}
