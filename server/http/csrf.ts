import crypto from "node:crypto";
import type { NextFunction, Request, Response } from "express";
import { HttpError } from "./errors";

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

const sameToken = (a: string, b: string) => {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && crypto.timingSafeEqual(x, y);
};

/**
 * Synchronizer token: every state-changing request carries X-CSRF-Token equal to the one stored in its session
 * (handed out by GET /api/auth/session). Requests authenticated by a bearer token carry no cookie and are exempt.
 */
export function csrfProtection(req: Request, _res: Response, next: NextFunction) {
  if (SAFE.has(req.method)) return next();
  if (/^Bearer\s/i.test(req.get("authorization") ?? "")) return next();
  const expected = req.session?.csrfToken;
  const sent = req.get("x-csrf-token");
  if (!expected || !sent || !sameToken(expected, sent)) {
    return next(new HttpError(403, "csrf", "missing or wrong X-CSRF-Token header; fetch GET /api/auth/session first"));
  }
  next();
}
