import { Router } from "express";
import type { AppDeps } from "../../deps";
import { currentUser, optionalUser, requireAuth } from "../../http/auth";
import { HttpError } from "../../platform/errors";
import { parseBody } from "../../http/validate";
import { destroySession, newCsrfToken, regenerate, saveSession, SESSION_COOKIE } from "../../http/session";
import { changePasswordRequestSchema, loginRequestSchema } from "../../../shared/schemas";
import { changePassword } from "../users";
import { recordSignOut, verifyCredentials } from "./auth.service";
import { loginLimiters, passwordChangeLimiter } from "./auth.limits";
import { clearCookieToken, issueCookieToken } from "../../http/csrf-cookie";

export function authRouter(deps: AppDeps) {
  const r = Router();
  const secure = deps.config.cookieSecure;
  // Answers carry CSRF tokens and user details: no browser or proxy cache may keep them.
  r.use((_req, res, next) => {
    res.set("Cache-Control", "no-store");
    next();
  });

  // Signed in: the session's synchronizer token. Anonymous: a signed cookie token, so no session row is stored.
  r.get("/session", async (req, res) => {
    // A bearer-token request has no session (bearerAuth skips the session middleware), so there is none to describe.
    if (res.locals.viaToken) {
      throw new HttpError(400, "no_session", "API tokens carry no session; this route is for browser sign-in", {
        authorization: "send no bearer token here",
      });
    }
    const user = optionalUser(res) ?? null;
    if (user && req.session.userId) {
      if (!req.session.csrfToken) {
        req.session.csrfToken = newCsrfToken();
        await saveSession(req);
      }
      return res.json({ user, csrfToken: req.session.csrfToken });
    }
    res.json({ user: null, csrfToken: issueCookieToken(req, res, secure) });
  });

  r.post("/login", ...loginLimiters(deps), async (req, res) => {
    const { email, password } = parseBody(loginRequestSchema, req);
    const user = await verifyCredentials(deps, email, password, req.ip ?? "");
    // A new session id at sign-in, so a session fixed before sign-in is worthless.
    await regenerate(req);
    req.session.userId = user.id;
    req.session.csrfToken = newCsrfToken();
    await saveSession(req);
    clearCookieToken(res, secure);
    res.json({ user, csrfToken: req.session.csrfToken });
  });

  r.post("/logout", async (req, res) => {
    const user = optionalUser(res);
    await destroySession(req);
    if (user) await recordSignOut(deps, user.id);
    res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: "lax", secure });
    res.status(204).end();
  });

  r.post("/password", requireAuth, passwordChangeLimiter(deps), async (req, res) => {
    const input = parseBody(changePasswordRequestSchema, req);
    const user = currentUser(res);
    await changePassword(deps, user, input);
    // Every stored session of the user was ended; this one continues under a new id (a copied cookie is now
    // worthless) and keeps its CSRF token, so the page that changed the password goes on working.
    const csrfToken = req.session.csrfToken;
    await regenerate(req);
    req.session.userId = user.id;
    req.session.csrfToken = csrfToken;
    await saveSession(req);
    res.status(204).end();
  });

  return r;
}
