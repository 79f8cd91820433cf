import type { NextFunction, Request, Response } from "express";
import type { AppDeps } from "../deps";
import { AppError, NotSignedIn } from "../platform/errors";
import { activeSessionUser, liveToken } from "../platform/identity";
import { onlyReads, scopesAllow } from "./token-scopes";

/**
 * `Authorization: Bearer <token>`: a personal API token. Such requests carry no session (and so need no CSRF token)
 * and reach only what the token's scopes grant (server/http/token-scopes.ts).
 */
export function bearerAuth(deps: AppDeps) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const header = req.get("authorization");
    if (header === undefined || !/^Bearer\b/i.test(header)) return next();
    // A header that claims a token but is malformed ("Bearer a b", "Bearer") is refused outright, never ignored:
    // ignoring it used to leave a cookie-authenticated request that skipped the CSRF check.
    const m = /^Bearer +([A-Za-z0-9_\-.~+/]+=*) *$/i.exec(header);
    if (!m) {
      return next(
        new AppError("unauthenticated", "unauthorized", "the Authorization header is malformed", {
          authorization: 'expected "Bearer <token>"',
        }),
      );
    }
    const token = await liveToken(deps.db, m[1]);
    const user = token ? await activeSessionUser(deps.db, token.userId) : undefined;
    if (!token || !user) return next(new NotSignedIn("the API token is unknown, revoked or its owner is deactivated"));
    if (!scopesAllow(token.scopes, req.method, req.path)) {
      if (onlyReads(token.scopes) && req.method !== "GET" && req.method !== "HEAD") {
        return next(new AppError("forbidden", "read_only_token", "this API token is read-only"));
      }
      return next(
        new AppError(
          "forbidden",
          "token_scope",
          `this API token's scopes (${token.scopes.join(", ")}) do not allow ${req.method} /api${req.path}`,
        ),
      );
    }
    res.locals.user = user;
    res.locals.viaToken = true;
    next();
  };
}

/** Runs the wrapped middleware only for requests without a bearer token. */
export const unlessBearer =
  (mw: (req: Request, res: Response, next: NextFunction) => void) =>
  (req: Request, res: Response, next: NextFunction) => (res.locals.viaToken ? next() : mw(req, res, next));
