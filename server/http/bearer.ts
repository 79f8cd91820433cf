import type { NextFunction, Request, Response } from "express";
import type { AppDeps } from "../deps";
import { HttpError, Unauthorized } from "./errors";
import { findUserById } from "../features/users/users.repo";
import { toSessionUser } from "../features/users/users.service";
import { userIdForToken } from "../features/tokens/tokens.service";

const SAFE = new Set(["GET", "HEAD"]);

/**
 * `Authorization: Bearer <token>`: a personal read-only API token. Such requests carry no session (and so need no
 * CSRF token); anything but GET/HEAD is refused.
 */
export function bearerAuth(deps: AppDeps) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const header = req.get("authorization");
    if (header === undefined || !/^Bearer\b/i.test(header)) return next();
    // A header that claims a token but is malformed ("Bearer a b", "Bearer") is refused outright, never ignored:
    // ignoring it used to leave a cookie-authenticated request that skipped the CSRF check.
    const m = /^Bearer +([A-Za-z0-9_\-.~+/]+=*) *$/i.exec(header);
    if (!m) {
      return next(new HttpError(401, "unauthorized", "the Authorization header is malformed", { authorization: "expected \"Bearer <token>\"" }));
    }
    const userId = await userIdForToken(deps, m[1]);
    const row = userId ? await findUserById(deps.db, userId) : undefined;
    if (!row || !row.active) return next(new Unauthorized("the API token is unknown, revoked or its owner is deactivated"));
    if (!SAFE.has(req.method)) return next(new HttpError(403, "read_only_token", "API tokens are read-only"));
    res.locals.user = toSessionUser(row);
    res.locals.viaToken = true;
    next();
  };
}

/** Runs the wrapped middleware only for requests without a bearer token. */
export const unlessBearer =
  (mw: (req: Request, res: Response, next: NextFunction) => void) => (req: Request, res: Response, next: NextFunction) =>
    res.locals.viaToken ? next() : mw(req, res, next);
