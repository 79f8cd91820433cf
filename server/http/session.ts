import crypto from "node:crypto";
import type { NextFunction, Request, Response } from "express";
import session from "express-session";
import { throttledPgStore } from "./session-store";
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

/**
 * Sessions live in PostgreSQL, so every instance sees every session. They use their own small pool when the server
 * gives one (server/index.ts): reading a session never queues behind slow list queries on the main pool.
 */
export function sessionMiddleware(deps: AppDeps) {
  return session({
    name: SESSION_COOKIE,
    secret: deps.config.sessionSecret,
    store: throttledPgStore(deps.sessionPool ?? deps.pool, { prune: deps.config.env !== "test" }),
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
