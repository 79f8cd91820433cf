import crypto from "node:crypto";
import type { Request, Response } from "express";

/**
 * Anonymous visitors (the sign-in page) get their CSRF token from a signed double-submit cookie instead of a
 * stored session: the cookie holds the token signed with SESSION_SECRET (cookie-parser's `s:` format), the answer
 * body holds the token itself, and a state-changing request must send that token in X-CSRF-Token. Nothing is
 * written to the database before sign-in. The signature stops a sibling host from planting a token of its choosing.
 */
export const CSRF_COOKIE = "rw.csrf";

const newToken = () => crypto.randomBytes(32).toString("base64url");

/** The token in a validly signed cookie, or undefined (cookie-parser has already checked the signature). */
export function csrfFromCookie(req: Request): string | undefined {
  const v = (req.signedCookies as Record<string, unknown> | undefined)?.[CSRF_COOKIE];
  return typeof v === "string" && v.length > 0 ? v : undefined;
}

/** Reuses the visitor's valid cookie token, or sets a new one; returns the token for the answer body. */
export function issueCookieToken(req: Request, res: Response, secure: boolean): string {
  const existing = csrfFromCookie(req);
  if (existing) return existing;
  const token = newToken();
  res.cookie(CSRF_COOKIE, token, { signed: true, httpOnly: true, sameSite: "lax", secure, path: "/api" });
  return token;
}

export function clearCookieToken(res: Response, secure: boolean) {
  res.clearCookie(CSRF_COOKIE, { httpOnly: true, sameSite: "lax", secure, path: "/api" });
}
