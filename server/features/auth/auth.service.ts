import bcrypt from "bcryptjs";
import type { AppDeps } from "../../deps";
import { AppError } from "../../platform/errors";
import { recordAudit } from "../../platform/audit";
import { findUserByEmail } from "../users";
import { toSessionUser } from "../../platform/identity";

// Compared against when the e-mail is unknown, so both failures cost the same time. Made once per process at the
// configured cost (not at import, which every test worker and script would pay for at cost 12).
const dummyHashes = new Map<number, Promise<string>>();
function dummyHash(cost: number): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) dummyHashes.set(cost, (hash = bcrypt.hash("ropewalk-no-such-user", cost)));
  return hash;
}

export class InvalidCredentials extends AppError {
  constructor() {
    super("unauthenticated", "invalid_credentials", "e-mail or password is wrong");
  }
}

/** Same answer for an unknown e-mail, a wrong password and a deactivated account. */
export async function verifyCredentials(deps: AppDeps, email: string, password: string, address: string) {
  const row = await findUserByEmail(deps.db, email);
  const ok = await bcrypt.compare(password, row?.passwordHash ?? (await dummyHash(deps.config.bcryptCost)));
  if (!row || !ok || !row.active) {
    await recordAudit(deps.db, {
      actorId: row?.id ?? null,
      action: "auth.sign_in_failed",
      subjectType: "user",
      subjectId: row?.id ?? null,
      detail: { email, address },
    });
    throw new InvalidCredentials();
  }
  await recordAudit(deps.db, {
    actorId: row.id,
    action: "auth.signed_in",
    subjectType: "user",
    subjectId: row.id,
    detail: { address },
  });
  return toSessionUser(row);
}

export async function recordSignOut(deps: AppDeps, userId: number) {
  await recordAudit(deps.db, { actorId: userId, action: "auth.signed_out", subjectType: "user", subjectId: userId });
}
