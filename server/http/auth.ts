import type { NextFunction, Request, Response } from "express";
import type { Role, SessionUser } from "../../shared/schemas";
import { Forbidden, NotSignedIn } from "../platform/errors";
import { hasRole } from "../platform/roles";

/** The signed-in user, set by the session loader (or a bearer token) on res.locals.user. */
export function currentUser(res: Response): SessionUser {
  const user = res.locals.user as SessionUser | undefined;
  if (!user) throw new NotSignedIn();
  return user;
}

export function optionalUser(res: Response): SessionUser | undefined {
  return res.locals.user as SessionUser | undefined;
}

export function requireAuth(_req: Request, res: Response, next: NextFunction) {
  currentUser(res);
  next();
}

/** Passes when the user holds at least one of the roles. Roles are explicit: admin does not imply the others. */
export function requireRole(...roles: Role[]) {
  return (_req: Request, res: Response, next: NextFunction) => {
    const user = currentUser(res);
    if (!hasRole(user, ...roles)) {
      // Any one role suffices, so the roles are alternatives: "this needs the admin or approver role".
      const named = roles.length > 1 ? `${roles.slice(0, -1).join(", ")} or ${roles[roles.length - 1]}` : roles[0];
      throw new Forbidden(`This needs the ${named} role.`);
    }
    next();
  };
}
