import fs from "node:fs";
import path from "node:path";
import express from "express";
import helmet from "helmet";
import cookieParser from "cookie-parser";
import type { AppDeps } from "./deps";
import { NotFound } from "./platform/errors";
import { errorMiddleware } from "./http/error-middleware";
import { csrfProtection } from "./http/csrf";
import { loadUser, sessionMiddleware } from "./http/session";
import { OPEN_FEATURES, SESSION_FEATURES } from "./api-features";
import { mountFeature } from "./http/route";
import { bearerAuth, unlessBearer } from "./http/bearer";
import { rejectHostileInput } from "./http/hostile";
import { requestLog } from "./http/request-log";
import { createLogger } from "./logger";

export const JSON_LIMIT = "512kb";

/** Builds the app without listening; tests import this with their own deps. */
export function createApp(deps: AppDeps) {
  const app = express();
  app.disable("x-powered-by");
  const logger = deps.logger ?? createLogger({ level: deps.config.logLevel });
  app.use(requestLog(logger));
  app.set("trust proxy", deps.config.trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          "img-src": ["'self'", "data:", "blob:"],
          "upgrade-insecure-requests": deps.config.cookieSecure ? [] : null,
        },
      },
      strictTransportSecurity: deps.config.cookieSecure,
    }),
  );

  const api = express.Router();
  for (const f of OPEN_FEATURES) api.use(f.prefix || "/", mountFeature(f, deps));
  api.use(bearerAuth(deps));
  api.use(unlessBearer(cookieParser(deps.config.sessionSecret)));
  api.use(unlessBearer(sessionMiddleware(deps)));
  api.use(unlessBearer(loadUser(deps)));
  api.use(csrfProtection(deps.config.publicUrl));
  api.use(express.json({ limit: JSON_LIMIT }));
  api.use(rejectHostileInput);
  for (const f of SESSION_FEATURES) api.use(f.prefix, mountFeature(f, deps));
  api.use((_req, _res, next) => next(new NotFound("no such API route")));
  app.use("/api", api);

  const index = path.join(deps.config.clientDir, "index.html");
  if (fs.existsSync(index)) {
    app.use(express.static(deps.config.clientDir, { index: false, maxAge: "1h" }));
    app.get("/{*splat}", (_req, res) => res.sendFile(index));
  }
  app.use(errorMiddleware);
  return app;
}
