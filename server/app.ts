import zlib from "node:zlib";
import express from "express";
import helmet from "helmet";
import compression from "compression";
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
import { serveClient } from "./http/static-client";
import { COMPRESS_FROM_BYTES, DYNAMIC_BROTLI_QUALITY, DYNAMIC_GZIP_LEVEL } from "./platform/prepared-json";
// Our own validation wording for every zod parse on the server (installs a global zod error map).
import "../shared/validation-messages";

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

  // gzip/brotli for API answers and index.html; precompressed assets already carry Content-Encoding and are left
  // alone, as are server-sent events (their Cache-Control says no-transform) and prepared answers (route.ts). Low
  // levels: these bytes are compressed on every request (levels measured in server/platform/prepared-json.ts).
  app.use(
    compression({
      level: DYNAMIC_GZIP_LEVEL,
      threshold: COMPRESS_FROM_BYTES,
      brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: DYNAMIC_BROTLI_QUALITY } },
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

  serveClient(app, deps.config.clientDir);
  app.use(errorMiddleware);
  return app;
}
