import { Router, type Request } from "express";
import { rateLimit, ipKeyGenerator } from "express-rate-limit";
import type { AppDeps } from "../../deps";
import { HttpError } from "../../http/errors";
import { currentUser, optionalUser, requireAuth } from "../../http/auth";
import { parseBody } from "../../http/validate";
import { destroySession, newCsrfToken, regenerate, saveSession, SESSION_COOKIE } from "../../http/session";
import { changePasswordRequestSchema, loginRequestSchema } from "../../../shared/schemas";
import { changePassword } from "../users/users.service";
import { recordSignOut, verifyCredentials } from "./auth.service";

const tooMany = () => new HttpError(429, "rate_limited", "too many sign-in attempts; wait a few minutes and try again");

function loginLimiters(deps: AppDeps) {
  const { perAccount, perAddress, windowMs } = deps.config.login;
  const common = {
    windowMs,
    standardHeaders: "draft-8" as const,
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    handler: (_req: Request, _res: unknown, next: (e: unknown) => void) => next(tooMany()),
  };
  const byAddress = rateLimit({ ...common, limit: perAddress, keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? "")}` });
  const byAccount = rateLimit({
    ...common,
    limit: perAccount,
    keyGenerator: (req) => `acct:${String(req.body?.email ?? "").trim().toLowerCase()}`,
  });
  return [byAddress, byAccount];
}

export function authRouter(deps: AppDeps) {
  const r = Router();

  r.get("/session", async (req, res) => {
    if (!req.session.csrfToken) {
      req.session.csrfToken = newCsrfToken();
      await saveSession(req);
    }
    res.json({ user: optionalUser(res) ?? null, csrfToken: req.session.csrfToken });
  });

  r.post("/login", ...loginLimiters(deps), async (req, res) => {
    const { email, password } = parseBody(loginRequestSchema, req);
    const user = await verifyCredentials(deps, email, password, req.ip ?? "");
    // A new session id at sign-in, so a session fixed before sign-in is worthless.
    await regenerate(req);
    req.session.userId = user.id;
    req.session.csrfToken = newCsrfToken();
    await saveSession(req);
    res.json({ user, csrfToken: req.session.csrfToken });
  });

  r.post("/logout", async (req, res) => {
    const user = optionalUser(res);
    await destroySession(req);
    if (user) await recordSignOut(deps, user.id);
    res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: "lax", secure: deps.config.cookieSecure });
    res.status(204).end();
  });

  r.post("/password", requireAuth, async (req, res) => {
    const input = parseBody(changePasswordRequestSchema, req);
    await changePassword(deps, currentUser(res), req.sessionID, input);
    res.status(204).end();
  });

  return r;
}
