import crypto from "node:crypto";
import type { NextFunction, Request, Response } from "express";
import { AppError } from "../platform/errors";
import { csrfFromCookie } from "./csrf-cookie";

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

const sameToken = (a: string, b: string) => {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && crypto.timingSafeEqual(x, y);
};

const refuse = (message: string) => new AppError("forbidden", "csrf", message);

/**
 * Where a state-changing request comes from. Browsers send `Origin` on every POST/PUT/PATCH/DELETE (Fetch standard,
 * "append a request `Origin` header"), and `Sec-Fetch-Site` on requests from pages. A request with neither header is
 * not from a browser page (curl, a pipeline, Supertest): it cannot ride a victim's cookies, so it is let through
 * here and still has to present the CSRF token below. `Origin: null` (sandboxed frames, some redirects) is refused.
 */
function originProblem(req: Request, publicOrigin: string): string | undefined {
  const origin = req.get("origin");
  if (origin !== undefined) {
    const own = `${req.protocol}://${req.get("host") ?? ""}`;
    return origin === own || origin === publicOrigin ? undefined : `requests from ${origin} are not accepted`;
  }
  const site = req.get("sec-fetch-site");
  if (site !== undefined && site !== "same-origin" && site !== "none")
    return `cross-site requests (${site}) are not accepted`;
  return undefined;
}

const originOf = (url: string) => {
  try {
    return new URL(url).origin;
  } catch {
    return "";
  }
};

/**
 * Cookie-authenticated state changes must come from our own pages and carry X-CSRF-Token:
 * - signed in: the synchronizer token stored in the session (handed out by GET /api/auth/session and the login answer);
 * - anonymous (sign-in itself): a signed double-submit cookie, so visitors get a token without a stored session.
 * Only requests the bearer middleware actually authenticated (res.locals.viaToken) are exempt; a malformed or
 * unknown Authorization header exempts nothing.
 */
export function csrfProtection(publicUrl: string) {
  const publicOrigin = originOf(publicUrl);
  return (req: Request, res: Response, next: NextFunction) => {
    if (SAFE.has(req.method) || res.locals.viaToken === true) return next();
    const bad = originProblem(req, publicOrigin);
    if (bad) return next(refuse(bad));
    const expected = req.session?.userId ? req.session.csrfToken : csrfFromCookie(req);
    const sent = req.get("x-csrf-token");
    if (!expected || !sent || !sameToken(expected, sent)) {
      return next(refuse("missing or wrong X-CSRF-Token header; fetch GET /api/auth/session first"));
    }
    next();
  };
}
