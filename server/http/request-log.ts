import crypto from "node:crypto";
import type { IncomingMessage, ServerResponse } from "node:http";
import { pinoHttp } from "pino-http";
import type { Logger } from "../logger";
import { redactQuery } from "../logger";
import { safeError } from "../log-errors";

const SANE_ID = /^[A-Za-z0-9._-]{1,64}$/;

/**
 * One line per request with a request id (a proxy's X-Request-Id when it looks sane, else a new UUID), echoed in
 * the X-Request-Id answer header so a user's report can be matched to the log. Requests are logged as method, path
 * with query values blanked, status and time: no headers, cookies or bodies at all.
 */
export function requestLog(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const given = req.headers["x-request-id"];
      const id = typeof given === "string" && SANE_ID.test(given) ? given : crypto.randomUUID();
      res.setHeader("X-Request-Id", id);
      return id;
    },
    wrapSerializers: false,
    serializers: {
      req: (req: IncomingMessage & { id?: unknown; originalUrl?: string }) => ({
        id: req.id,
        method: req.method,
        url: redactQuery(req.originalUrl ?? req.url ?? ""),
      }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
      err: safeError,
    },
    customLogLevel: (_req, res, err) =>
      err || res.statusCode >= 500 ? "error" : res.statusCode >= 400 ? "warn" : "info",
  });
}
