import bcrypt from "bcryptjs";
import type { AppDeps } from "../../deps";
import { Conflict, Invalid, NotFound } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import * as repo from "./users.repo";
import type { CreateUserRequest, Role, SessionUser, UpdateUserRequest, User } from "../../../shared/schemas";
import { isUniqueViolation } from "../../db/errors";
import { pageWindow } from "../../platform/paging";
import type { UsersListQuery } from "../../../shared/schemas/users";
import { revokeAllTokensOfUser } from "../tokens";

export function toUser(row: Pick<repo.UserRow, keyof User>): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles as Role[],
    active: row.active,
    createdAt: row.createdAt.toISOString(),
  };
}

export { toSessionUser } from "../../platform/identity";

/** One page of users in id order (optionally those whose name or e-mail contains `q`). */
export async function listUsers(deps: AppDeps, q: UsersListQuery) {
  const query = { q: q.q, ...pageWindow(q.page, q.pageSize) };
  const [rows, count] = await Promise.all([repo.listUserPage(deps.db, query), repo.countUsers(deps.db, query)]);
  return { users: rows.map(toUser), ...count, page: q.page, pageSize: q.pageSize };
}

export async function createUser(deps: AppDeps, actor: SessionUser | null, input: CreateUserRequest) {
  const passwordHash = await bcrypt.hash(input.password, deps.config.bcryptCost);
  try {
    return await deps.db.transaction(async (tx) => {
      const row = await repo.insertUser(tx, { email: input.email, name: input.name, passwordHash, roles: input.roles });
      await recordAudit(tx, {
        actorId: actor?.id ?? null,
        action: "user.created",
        subjectType: "user",
        subjectId: row.id,
        detail: { email: row.email, roles: row.roles },
      });
      return toUser(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw new Conflict("a user with this e-mail already exists", { email: "already taken" });
    throw e;
  }
}

/** Role and activity changes; the last active admin cannot be demoted or deactivated. */
export async function updateUser(deps: AppDeps, actor: SessionUser, id: number, input: UpdateUserRequest) {
  return deps.db.transaction(async (tx) => {
    // Two last admins removing each other at once would both count two admins and leave none:
    // serialise every change that may remove an admin on the set of active admins.
    if (input.roles !== undefined || input.active === false) await repo.lockActiveAdmins(tx);
    const before = await repo.lockUserById(tx, id);
    if (!before) throw new NotFound("no such user");
    const losesAdmin =
      before.active &&
      before.roles.includes("admin") &&
      ((input.roles && !input.roles.includes("admin")) || input.active === false);
    if (losesAdmin && (await repo.countActiveAdmins(tx)) <= 1) {
      throw new Conflict("this is the last active admin; make someone else admin first", {
        [input.active === false ? "active" : "roles"]: "would leave no active admin",
      });
    }
    const row = await repo.updateUser(tx, id, input);
    const changes: Record<string, unknown> = {};
    if (input.active === false) {
      await repo.deleteSessionsOfUser(tx, id);
      // For good: a token must not come back to life when the account is reactivated.
      changes.tokensRevoked = await revokeAllTokensOfUser(tx, id);
    }
    if (input.roles) changes.roles = { from: before.roles, to: row.roles };
    if (input.active !== undefined && input.active !== before.active)
      changes.active = { from: before.active, to: row.active };
    if (input.name && input.name !== before.name) changes.name = { from: before.name, to: row.name };
    const action =
      input.active === false
        ? "user.deactivated"
        : input.active === true && !before.active
          ? "user.reactivated"
          : input.roles
            ? "user.roles_changed"
            : "user.updated";
    await recordAudit(tx, { actorId: actor.id, action, subjectType: "user", subjectId: id, detail: changes });
    return toUser(row);
  });
}

/** Ends every stored session and revokes every API token of the user; the router re-issues the caller's session. */
export async function changePassword(
  deps: AppDeps,
  actor: SessionUser,
  input: { currentPassword: string; newPassword: string },
) {
  const row = await repo.findUserById(deps.db, actor.id);
  if (!row || !(await bcrypt.compare(input.currentPassword, row.passwordHash))) {
    throw new Invalid("the current password is wrong", { currentPassword: "does not match" });
  }
  if (input.currentPassword === input.newPassword) {
    throw new Invalid("choose a new password", { newPassword: "same as the current one" });
  }
  const passwordHash = await bcrypt.hash(input.newPassword, deps.config.bcryptCost);
  await deps.db.transaction(async (tx) => {
    await repo.updateUser(tx, actor.id, { passwordHash });
    await repo.deleteSessionsOfUser(tx, actor.id);
    const tokensRevoked = await revokeAllTokensOfUser(tx, actor.id);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "user.password_changed",
      subjectType: "user",
      subjectId: actor.id,
      detail: { tokensRevoked },
    });
  });
}
