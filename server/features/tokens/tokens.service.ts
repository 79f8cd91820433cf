import crypto from "node:crypto";
import { and, desc, eq, isNull } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { apiTokens } from "../../db/schema";
import { NotFound } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import type { SessionUser, TokenScope } from "../../../shared/schemas";
import { hashTokenSecret, knownScopes } from "../../platform/identity";

const view = (t: typeof apiTokens.$inferSelect) => ({
  id: t.id,
  name: t.name,
  prefix: t.prefix,
  scopes: knownScopes(t.scopes),
  createdAt: t.createdAt.toISOString(),
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  revokedAt: t.revokedAt?.toISOString() ?? null,
});

/** A personal token with the given scopes; the secret is returned once and only its SHA-256 is kept. */
export async function createToken(deps: AppDeps, actor: SessionUser, name: string, scopes: TokenScope[]) {
  const secret = `rw_${crypto.randomBytes(32).toString("base64url")}`;
  return deps.db.transaction(async (tx) => {
    const [row] = await tx
      .insert(apiTokens)
      .values({ userId: actor.id, name, scopes, tokenHash: hashTokenSecret(secret), prefix: secret.slice(0, 10) })
      .returning();
    await recordAudit(tx, {
      actorId: actor.id,
      action: "token.created",
      subjectType: "token",
      subjectId: row.id,
      detail: { name, scopes },
    });
    return { ...view(row), token: secret };
  });
}

export async function listTokens(deps: AppDeps, actor: SessionUser) {
  const rows = await deps.db
    .select()
    .from(apiTokens)
    .where(eq(apiTokens.userId, actor.id))
    .orderBy(desc(apiTokens.createdAt));
  return rows.map(view);
}

export async function revokeToken(deps: AppDeps, actor: SessionUser, id: number) {
  await deps.db.transaction(async (tx) => {
    const [row] = await tx
      .update(apiTokens)
      .set({ revokedAt: new Date() })
      .where(and(eq(apiTokens.id, id), eq(apiTokens.userId, actor.id), isNull(apiTokens.revokedAt)))
      .returning();
    if (!row) throw new NotFound("no such active token of yours");
    await recordAudit(tx, {
      actorId: actor.id,
      action: "token.revoked",
      subjectType: "token",
      subjectId: id,
      detail: { name: row.name },
    });
  });
}

/**
 * Revokes every live token of a user (password change, deactivation). Revoked stays revoked: reactivating the
 * account does not bring a token back. Returns how many were revoked, for the caller's audit entry.
 */
export async function revokeAllTokensOfUser(ex: Executor, userId: number) {
  const rows = await ex
    .update(apiTokens)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id });
  return rows.length;
}
