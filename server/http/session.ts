import crypto from "node:crypto";
import type { NextFunction, Request, Response } from "express";
import session from "express-session";
import connectPgSimple from "connect-pg-simple";
import type { AppDeps } from "../deps";
import { activeSessionUser } from "../platform/identity";

declare module "express-session" {
  interface SessionData {
    userId?: number;
    csrfToken?: string;
  }
}

export const SESSION_COOKIE = "rw.sid";
export const newCsrfToken = () => crypto.randomBytes(32).toString("base64url");

export function sessionMiddleware(deps: AppDeps) {
  const PgStore = connectPgSimple(session);
  return session({
    name: SESSION_COOKIE,
    secret: deps.config.sessionSecret,
    store: new PgStore({
      pool: deps.pool,
      tableName: "session",
      createTableIfMissing: false,
      // Expired sessions are pruned every 15 minutes; tests build many apps and skip the timer.
      pruneSessionInterval: deps.config.env === "test" ? false : 15 * 60,
    }),
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: "lax",
      secure: deps.config.cookieSecure,
      maxAge: 12 * 60 * 60 * 1000,
    },
  });
}

/** Loads the signed-in user on every request; a deactivated or deleted user is signed out on the spot. */
export function loadUser(deps: AppDeps) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const id = req.session?.userId;
    if (id) {
      const user = await activeSessionUser(deps.db, id);
      if (user) res.locals.user = user;
      else delete req.session.userId;
    }
    next();
  };
}

export const regenerate = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
export const saveSession = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
export const destroySession = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
