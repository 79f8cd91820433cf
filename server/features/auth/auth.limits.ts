import type { Request, RequestHandler, Response } from "express";
import { rateLimit, ipKeyGenerator } from "express-rate-limit";
import type { AppDeps } from "../../deps";
import { RateLimited } from "../../platform/errors";
import { PgRateLimitStore } from "../../platform/rate-limit-store";

// Counts live in PostgreSQL (rate_limit_hits), shared by every instance on the database, unless `deps.limiterStore`
// hands out another store or config.rateLimitStore is "memory" (the default under NODE_ENV=test, so parallel test
// files do not share counters); each limiter asks for its store by name.
const tooMany = (what: string) =>
  new RateLimited(`too many ${what}; wait a few minutes and try again`, undefined, "rate_limited");
const emailOf = (req: Request) =>
  String((req.body as { email?: unknown } | undefined)?.email ?? "")
    .trim()
    .toLowerCase();
const addressOf = (req: Request) => ipKeyGenerator(req.ip ?? "");

function limiter(
  deps: AppDeps,
  name: string,
  limit: number,
  windowMs: number,
  what: string,
  key: (req: Request, res: Response) => string,
) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // Only failures count: a correct password never uses up anyone's allowance.
    skipSuccessfulRequests: true,
    store:
      deps.limiterStore?.(name) ??
      (deps.config.rateLimitStore === "postgres" ? new PgRateLimitStore(deps.pool) : undefined),
    // The one place a key gets the limiter's name (the store adds nothing): `login-addr:<address>` and so on.
    keyGenerator: (req, res) => `${name}:${key(req, res)}`,
    handler: (_req, _res, next) => next(tooMany(what)),
  });
}

/**
 * Sign-in failures are counted three ways, so a stranger guessing at an account cannot lock its owner out:
 * - account + address (tight, 10 per 15 min by default): the one a guesser hits first, only for their own address;
 * - address across accounts (spraying one password over many accounts);
 * - account across addresses (a slower ceiling over a longer window, against guessing from many addresses).
 */
export function loginLimiters(deps: AppDeps): RequestHandler[] {
  const l = deps.config.login;
  return [
    limiter(deps, "login-addr", l.perAddress, l.windowMs, "sign-in attempts from this address", (req) =>
      addressOf(req),
    ),
    limiter(
      deps,
      "login-acct-addr",
      l.perAccountAddress,
      l.windowMs,
      "sign-in attempts",
      (req) => `${emailOf(req)}|${addressOf(req)}`,
    ),
    limiter(deps, "login-acct", l.perAccount, l.accountWindowMs, "sign-in attempts for this account", (req) =>
      emailOf(req),
    ),
  ];
}

/** Wrong current passwords on the change-password form, per signed-in user (the route runs after requireAuth). */
export function passwordChangeLimiter(deps: AppDeps): RequestHandler {
  const l = deps.config.login;
  return limiter(deps, "password", l.perAccountAddress, l.windowMs, "password change attempts", (_req, res) =>
    String((res.locals.user as { id: number } | undefined)?.id ?? "none"),
  );
}
