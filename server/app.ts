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
import { authRouter } from "./features/auth/auth.router";
import { usersRouter } from "./features/users/users.router";
import { healthRouter } from "./features/health/health.router";
import { modelsRouter } from "./features/models";
import { plansRouter, plansUsingModel } from "./features/plans";
import { tokensRouter } from "./features/tokens/tokens.router";
import { auditRouter } from "./features/audit/audit.router";
import { mailRouter } from "./features/mail/mail.router";
import { analysesRouter } from "./features/analyses/analyses.router";
import { boundsRouter } from "./features/bounds/bounds.router";
import { openApiDocument } from "./openapi";
import { acceleratorsRouter, budgetsRouter } from "./features/budgets/budgets.router";
import { bearerAuth, unlessBearer } from "./http/bearer";
import { rejectHostileInput } from "./http/hostile";
import { requestLog } from "./http/request-log";
import { createLogger } from "./logger";
import { signingKeyRouter } from "./features/plans/signing-key.router";

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
        directives: { "img-src": ["'self'", "data:", "blob:"], "upgrade-insecure-requests": deps.config.cookieSecure ? [] : null },
      },
      strictTransportSecurity: deps.config.cookieSecure,
    }),
  );

  const api = express.Router();
  api.use("/health", healthRouter(deps));
  api.get("/openapi.json", (_req, res) => res.json(openApiDocument()));
  api.use("/signing-key", signingKeyRouter(deps));
  api.use(bearerAuth(deps));
  api.use(unlessBearer(cookieParser(deps.config.sessionSecret)));
  api.use(unlessBearer(sessionMiddleware(deps)));
  api.use(unlessBearer(loadUser(deps)));
  api.use(csrfProtection(deps.config.publicUrl));
  api.use(express.json({ limit: JSON_LIMIT }));
  api.use(rejectHostileInput);
  api.use("/auth", authRouter(deps));
  api.use("/users", usersRouter(deps));
  api.use("/models", modelsRouter(deps, plansUsingModel));
  api.use("/analyses", analysesRouter(deps));
  api.use("/bounds", boundsRouter(deps));
  api.use("/plans", plansRouter(deps));
  api.use("/tokens", tokensRouter(deps));
  api.use("/audit", auditRouter(deps));
  api.use("/mail", mailRouter(deps));
  api.use("/budgets", budgetsRouter(deps));
  api.use("/accelerators", acceleratorsRouter(deps));
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
