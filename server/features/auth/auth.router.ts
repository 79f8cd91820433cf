import type { AppDeps } from "../../deps";
import { optionalUser } from "../../http/auth";
import { AppError } from "../../platform/errors";
import { route, type ApiFeature } from "../../http/route";
import { noStore } from "../../http/no-store";
import { destroySession, newCsrfToken, regenerate, saveSession, SESSION_COOKIE } from "../../http/session";
import {
  changePasswordRequestSchema,
  loginRequestSchema,
  loginResponseSchema,
  sessionResponseSchema,
} from "../../../shared/schemas";
import { changePassword } from "../users";
import { recordSignOut, verifyCredentials } from "./auth.service";
import { loginLimiters, passwordChangeLimiter } from "./auth.limits";
import { clearCookieToken, issueCookieToken } from "../../http/csrf-cookie";

const noContent = { contentType: null, description: "Done; no body" };
const secure = (deps: AppDeps) => deps.config.cookieSecure;

/** Mounted at /api/auth. Answers carry CSRF tokens and user details: no browser or proxy cache may keep them. */
export const authFeature: ApiFeature = {
  prefix: "/auth",
  tag: "auth",
  use: [noStore],
  routes: [
    // Signed in: the session's synchronizer token. Anonymous: a signed cookie token, so no session row is stored.
    route({
      method: "get",
      path: "/session",
      summary: "Current user and CSRF token",
      access: "public",
      responses: { 200: sessionResponseSchema },
      handler: async ({ deps, req, res }) => {
        // A bearer-token request has no session (bearerAuth skips the session middleware), so there is none to describe.
        if (res.locals.viaToken) {
          throw new AppError(
            "invalid",
            "no_session",
            "API tokens carry no session; this route is for browser sign-in",
            {
              authorization: "send no bearer token here",
            },
          );
        }
        const user = optionalUser(res) ?? null;
        if (user && req.session.userId) {
          if (!req.session.csrfToken) {
            req.session.csrfToken = newCsrfToken();
            await saveSession(req);
          }
          return { status: 200, body: { user, csrfToken: req.session.csrfToken } };
        }
        return { status: 200, body: { user: null, csrfToken: issueCookieToken(req, res, secure(deps)) } };
      },
    }),
    route({
      method: "post",
      path: "/login",
      summary: "Sign in",
      access: "public",
      body: loginRequestSchema,
      middleware: (deps) => loginLimiters(deps),
      responses: { 200: loginResponseSchema },
      handler: async ({ deps, req, res, body }) => {
        const user = await verifyCredentials(deps, body.email, body.password, req.ip ?? "");
        // A new session id at sign-in, so a session fixed before sign-in is worthless.
        await regenerate(req);
        req.session.userId = user.id;
        const csrfToken = newCsrfToken();
        req.session.csrfToken = csrfToken;
        await saveSession(req);
        clearCookieToken(res, secure(deps));
        return { status: 200, body: { user, csrfToken } };
      },
    }),
    route({
      method: "post",
      path: "/logout",
      summary: "Sign out",
      access: "public",
      responses: { 204: noContent },
      handler: async ({ deps, req, res }) => {
        const user = optionalUser(res);
        await destroySession(req);
        if (user) await recordSignOut(deps, user.id);
        res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: "lax", secure: secure(deps) });
        return { status: 204, raw: null };
      },
    }),
    route({
      method: "post",
      path: "/password",
      summary: "Change own password",
      access: "signed-in",
      body: changePasswordRequestSchema,
      middleware: (deps) => [passwordChangeLimiter(deps)],
      responses: { 204: noContent },
      handler: async ({ deps, req, user, body }) => {
        await changePassword(deps, user, body);
        // Every stored session of the user was ended; this one continues under a new id (a copied cookie is now
        // worthless) and keeps its CSRF token, so the page that changed the password goes on working.
        const csrfToken = req.session.csrfToken;
        await regenerate(req);
        req.session.userId = user.id;
        req.session.csrfToken = csrfToken;
        await saveSession(req);
        return { status: 204, raw: null };
      },
    }),
  ],
};
