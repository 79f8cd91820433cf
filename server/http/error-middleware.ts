import type { NextFunction, Request, Response } from "express";
import { ZodError } from "zod";
import { AppError, RateLimited } from "../platform/errors";
import { httpStatusOf } from "./error-status";
import { issuesToFields } from "../platform/validate";
import { summarizeFields } from "../../shared/validation-messages";
import { isDatabaseUnavailable } from "../db/errors";
import { sizeLabel } from "./file-upload";

type BodyParserError = Error & { type?: string; status?: number };
type MulterLike = Error & { code?: string; field?: string; name: string };

/** The one place errors become responses: { error: { code, message, fields? } }, never a stack trace. */
export function errorMiddleware(err: unknown, req: Request, res: Response, _next: NextFunction) {
  if (res.headersSent) return;
  const send = (status: number, code: string, message: string, fields?: Record<string, string>) =>
    res.status(status).json({ error: fields ? { code, message, fields } : { code, message } });

  if (err instanceof RateLimited && err.retryAfterSeconds !== undefined)
    res.set("Retry-After", String(err.retryAfterSeconds));
  if (err instanceof AppError) return send(httpStatusOf(err), err.code, err.message, err.fields);
  if (err instanceof ZodError) {
    const fields = issuesToFields(err);
    return send(400, "invalid", summarizeFields(fields), fields);
  }
  const bp = err as BodyParserError;
  if (bp?.type === "entity.parse.failed")
    return send(400, "malformed_json", "the request body is not valid JSON", { "(body)": "not valid JSON" });
  if (bp?.type === "entity.too.large") return send(413, "too_large", "the request body is too large");
  if (bp?.type === "charset.unsupported" || bp?.type === "encoding.unsupported")
    return send(415, "unsupported", bp.message);
  const mu = err as MulterLike;
  if (mu?.name === "MulterError") {
    // An oversize file names the part and the limit; its status is the upload's own contract (file-upload.ts).
    if (mu.code === "LIMIT_FILE_SIZE") {
      const limit =
        typeof res.locals.uploadLimitBytes === "number" ? ` than ${sizeLabel(res.locals.uploadLimitBytes)}` : "";
      const status = res.locals.uploadOversizeStatus === 413 ? 413 : 400;
      return send(status, "too_large", `the uploaded file is larger${limit}`, {
        [mu.field ?? "file"]: `larger${limit}`,
      });
    }
    return send(400, "invalid_upload", mu.message, { [mu.field ?? "file"]: mu.message });
  }
  if (typeof bp?.status === "number" && bp.status >= 400 && bp.status < 500)
    return send(bp.status, "bad_request", bp.message);

  if (isDatabaseUnavailable(err)) {
    // Logged without the error object: driver errors can carry query parameters and connection details.
    req.log.warn({ err }, "database unavailable");
    res.set("Retry-After", "5");
    return send(503, "database_unavailable", "the database is unavailable right now; try again in a few seconds");
  }
  // The logger's error serializer (server/log-errors.ts) keeps query parameters and driver internals out.
  req.log.error({ err }, "unhandled error");
  return send(500, "internal", "something went wrong on our side; it has been logged");
}
